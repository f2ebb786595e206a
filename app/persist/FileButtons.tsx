/**
 * Open and Save for the top bar: Open takes a project file or a photo (PNG, JPEG),
 * Save downloads NAME.inkroute. Ctrl+O and Ctrl+S do the same. Also installs the
 * window-wide file drop while mounted.
 */
import { useEffect, useRef, useState } from 'react';
import { editorStore, useEditor } from '../store/useEditor.ts';
import { hasUnsavedWork } from './autosave.ts';
import { DiscardQuestion } from './DiscardQuestion.tsx';
import { OpenExampleButton } from './openExample.tsx';
import { installFileDrop, OPEN_ACCEPT, openFile, saveProjectFile } from './projectIO.ts';

export function FileButtons() {
  const input = useRef<HTMLInputElement>(null);
  const hasProject = useEditor((s) => s.project !== undefined);
  const unsaved = useEditor(hasUnsavedWork);
  const title = useEditor((s) => s.project?.title);
  // A file chosen or dropped while there is unsaved work waits for the person's answer.
  const [waiting, setWaiting] = useState<File | undefined>(undefined);
  const request = (file: File) => {
    if (hasUnsavedWork(editorStore.getState())) setWaiting(file);
    else void openFile(file);
  };

  useEffect(() => installFileDrop(window, editorStore, (file) => request(file)), []);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.altKey || e.shiftKey) return;
      const key = e.key.toLowerCase();
      // The browser's own save and open dialogs would be of no use here.
      if (key === 's') {
        e.preventDefault();
        saveProjectFile();
      } else if (key === 'o') {
        e.preventDefault();
        input.current?.click();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);

  return (
    <span className="file-buttons">
      <button type="button" onClick={() => input.current?.click()} title="Open a project file or a photo (Ctrl+O)">Open…</button>
      <OpenExampleButton />
      <button
        type="button"
        onClick={() => saveProjectFile()}
        disabled={!hasProject}
        title={unsaved ? 'Save the project as a .inkroute file (Ctrl+S); it has unsaved changes' : 'Save the project as a .inkroute file (Ctrl+S)'}
      >
        Save{unsaved ? ' •' : ''}
      </button>
      <input
        ref={input}
        type="file"
        accept={OPEN_ACCEPT}
        aria-label="Open a project or image"
        hidden
        onChange={(e) => {
          const file = e.currentTarget.files?.[0];
          // Cleared so that choosing the same file again still fires a change.
          e.currentTarget.value = '';
          if (file) request(file);
        }}
      />
      {waiting && (
        <DiscardQuestion
          title={title}
          action={`opening ${waiting.name}`}
          goLabel={`Open ${waiting.name}`}
          onKeep={() => setWaiting(undefined)}
          onGo={() => {
            const file = waiting;
            setWaiting(undefined);
            void openFile(file);
          }}
        />
      )}
    </span>
  );
}
