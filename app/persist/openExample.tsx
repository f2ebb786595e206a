/**
 * "Open finished example": the demo inscription with every stroke traced and its letters
 * made (public/examples/finished.inkroute, written by `npm run demo`), opened as a saved
 * project through the same path as the Open button (projectIO.openProjectFile). With
 * unsaved work open, it asks first.
 */
import { useState } from 'react';
import { createPortal } from 'react-dom';
import type { EditorStore } from '../store/store.ts';
import { editorStore, useEditor } from '../store/useEditor.ts';
import { hasUnsavedWork } from './autosave.ts';
import { openProjectFile } from './projectIO.ts';
import './persist.css';

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
      {/* On the page's body: the top bar's styles (dark buttons, no wrapping) are not the question's. */}
      {asking && createPortal(
        <div
          className="restore-backdrop"
          onKeyDown={(e) => {
            e.stopPropagation();
            if (e.key === 'Escape') setAsking(false);
          }}
        >
          <div className="restore-offer" role="dialog" aria-modal="true" aria-labelledby="open-example-question">
            <p id="open-example-question">
              <strong>{title || 'untitled'}</strong> has unsaved changes, which opening the finished example
              would lose (Save keeps them in a file). Open the example anyway?
            </p>
            <div className="restore-buttons">
              {/* Keeping the work is the safe answer, so it takes the focus. */}
              <button type="button" autoFocus onClick={() => setAsking(false)}>Keep my work</button>
              <button type="button" onClick={open}>Open the example</button>
            </div>
          </div>
        </div>,
        document.body,
      )}
    </>
  );
}
