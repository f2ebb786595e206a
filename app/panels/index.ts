/**
 * The editor's panels. App places them: StrokesPanel on the left, DetailsPanel on the
 * right, StatusStrip at the bottom; none takes props, all read the editor's store.
 * Each brings its own stylesheet (panels.css) and fills the box App gives it.
 */
export { StrokesPanel } from './StrokesPanel.tsx';
export { DetailsPanel } from './DetailsPanel.tsx';
export { StatusStrip, JOB_SHOW_AFTER_MS } from './StatusStrip.tsx';
export { resolveStroke, SettingsEdit, type ResolveOptions, type SettingsTarget } from './resolve.ts';
