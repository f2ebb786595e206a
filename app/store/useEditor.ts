/** The editor's one store instance and the React hook that reads it. */
import { useStore } from 'zustand';
import { createEditorStore, type EditorState } from './store.ts';

export const editorStore = createEditorStore();

export function useEditor<T>(selector: (s: EditorState) => T): T {
  return useStore(editorStore, selector);
}
