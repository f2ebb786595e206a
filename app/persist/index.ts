/**
 * Saving, opening and keeping work in the browser. What App does with it:
 * - on start, once: `startup(loadDemo)`, where loadDemo loads the demo into the editor's
 *   store (store.loadProject) and resolves when it is loaded; startup asks about unsaved
 *   work first and starts the autosave afterwards;
 * - render `<RestoreOffer />` anywhere (it draws a fixed overlay while the question is open);
 * - render `<FileButtons />` in the top bar (Open…, Save, Ctrl+O / Ctrl+S, and the
 *   window-wide file drop while mounted).
 */
export { RestoreOffer } from './RestoreOffer.tsx';
export { FileButtons } from './FileButtons.tsx';
export { startup, autosaveOf, restoreOfferStore, restoreWork, type RestoreOfferState, type StartupOptions } from './startup.ts';
export {
  saveProjectFile, openProjectFile, openImageFile, openFile, installFileDrop, projectFileBytes, projectFileName,
  PROJECT_EXTENSION, OPEN_ACCEPT,
} from './projectIO.ts';
export {
  startAutosave, hasUnsavedWork, readWork, readImages, clearWork, workStore,
  type Autosave, type AutosaveOptions, type WorkRecord,
} from './autosave.ts';
