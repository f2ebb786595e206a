/**
 * The bottom strip: scale, zoom, cursor (mm once calibrated), the last solve time, the
 * jobs that take long enough to notice (with Cancel), unsaved work, and the message of
 * the moment (errors as an alert, read out by screen readers).
 */
import { useEffect, useRef, useState } from 'react';
import type { ScaleSource } from '../../src/doc/model.ts';
import { editorStore, useEditor } from '../store/useEditor.ts';
import { hasUnsavedWork } from '../persist/autosave.ts';
import { formatPoint } from './format.ts';
import './panels.css';

/** Where the scale came from, in the strip's words. */
export function scaleSourceText(source: ScaleSource | undefined): string {
  if (!source) return 'given with the image';
  if (source.kind === 'ruler') return `from a ruler (${source.mm} mm), figures in mm`;
  return `from the file's resolution tag (${source.detail}); check it with Calibrate`;
}

/** Jobs shorter than this are not shown: a flash of a bar is noise, ms. */
export const JOB_SHOW_AFTER_MS = 300;
/** Info messages go away by themselves after this long, ms; errors stay until dismissed. */
const INFO_MS = 8000;

export function StatusStrip() {
  const surface = useEditor((s) => s.project?.surfaces[0]);
  const zoom = useEditor((s) => s.zoom);
  const cursor = useEditor((s) => s.cursor);
  const lastSolveMs = useEditor((s) => s.lastSolveMs);
  const jobs = useEditor((s) => s.jobs);
  const message = useEditor((s) => s.message);
  const unsaved = useEditor(hasUnsavedWork);
  const hasProject = surface !== undefined;
  const pxPerMm = surface?.pxPerMm;

  // When each job was first seen: the store's jobs carry no start time.
  const seen = useRef(new Map<string, number>());
  const [now, setNow] = useState(() => performance.now());
  const ids = Object.keys(jobs);
  for (const id of ids) if (!seen.current.has(id)) seen.current.set(id, performance.now());
  for (const id of [...seen.current.keys()]) if (!(id in jobs)) seen.current.delete(id);
  const pendingIds = ids.join('\n');
  useEffect(() => {
    if (!pendingIds) return;
    const timer = setInterval(() => setNow(performance.now()), 100);
    return () => clearInterval(timer);
  }, [pendingIds]);
  const shownJobs = ids.filter((id) => now - (seen.current.get(id) ?? now) >= JOB_SHOW_AFTER_MS);

  useEffect(() => {
    if (message?.kind !== 'info') return;
    const timer = setTimeout(() => {
      if (editorStore.getState().message === message) editorStore.getState().setMessage(undefined);
    }, INFO_MS);
    return () => clearTimeout(timer);
  }, [message]);

  return (
    <footer className="status status-strip" aria-label="Status">
      <span className="status-scale">
        scale {!hasProject ? '–' : pxPerMm ? `${pxPerMm.toFixed(1)} px/mm` : 'not calibrated'}
        {hasProject && pxPerMm ? ` · ${scaleSourceText(surface?.scaleSource)}` : ''}
      </span>
      <span>zoom {Math.round(zoom * 100)} %</span>
      <span>cursor {cursor ? formatPoint(cursor.x, cursor.y, pxPerMm) : '–'}</span>
      <span>last solve {lastSolveMs !== undefined ? `${Math.round(lastSolveMs)} ms` : '–'}</span>
      {unsaved && <span className="status-unsaved" title="Kept in this browser; save to a file to keep it for good">unsaved changes</span>}
      {shownJobs.map((id) => {
        const job = jobs[id];
        return (
          <span key={id} className="status-job">
            {job.label}
            <progress max={1} value={job.progress} aria-label={job.label} />
            {job.cancel && <button type="button" onClick={job.cancel}>Cancel</button>}
          </span>
        );
      })}
      {message && (
        <span className={`status-message ${message.kind}`} role={message.kind === 'error' ? 'alert' : 'status'}>
          {message.text}
          <button type="button" aria-label="Dismiss the message" onClick={() => editorStore.getState().setMessage(undefined)}>×</button>
        </span>
      )}
    </footer>
  );
}
