/**
 * "Open finished example": the demo inscription with every stroke traced and its letters
 * made (public/examples/finished.inkroute, written by `npm run demo`), opened as a saved
 * project through the same path as the Open button (projectIO.openProjectFile). With
 * unsaved work open, it asks first.
 */
import { useState } from 'react';
import type { EditorStore } from '../store/store.ts';
import { editorStore, useEditor } from '../store/useEditor.ts';
import { hasUnsavedWork } from './autosave.ts';
import { DiscardQuestion } from './DiscardQuestion.tsx';
import { openProjectFile } from './projectIO.ts';

export const EXAMPLE_FILE = 'finished.inkroute';
export const EXAMPLE_URL = `${import.meta.env.BASE_URL}examples/${EXAMPLE_FILE}`;

/** Fetches the finished example and opens it; a missing file gives one message and the open project stays. */
export async function openFinishedExample(store: EditorStore = editorStore): Promise<boolean> {
  let bytes: ArrayBuffer;
  try {
    const res = await fetch(EXAMPLE_URL);
    if (!res.ok) throw new Error(`it is not there (${res.status}); run npm run demo`);
    bytes = await res.arrayBuffer();
  } catch (e) {
    store.getState().setMessage({ kind: 'error', text: `Could not open the finished example: ${(e as Error).message}.` });
    return false;
  }
  return openProjectFile(new File([bytes], EXAMPLE_FILE, { type: 'application/zip' }), store);
}

/** The top-bar button, with its question when there is unsaved work. */
export function OpenExampleButton() {
  const unsaved = useEditor(hasUnsavedWork);
  const title = useEditor((s) => s.project?.title);
  const [asking, setAsking] = useState(false);
  const [busy, setBusy] = useState(false);
  const open = () => {
    setAsking(false);
    setBusy(true);
    void openFinishedExample().finally(() => setBusy(false));
  };
  return (
    <>
      <button
        type="button" disabled={busy}
        title="Open the demo inscription with every stroke traced and its letters made"
        onClick={() => (unsaved ? setAsking(true) : open())}
      >
        Open finished example
      </button>
      {asking && (
        <DiscardQuestion
          title={title}
          action="opening the finished example"
          goLabel="Open the example"
          onKeep={() => setAsking(false)}
          onGo={open}
        />
      )}
    </>
  );
}
