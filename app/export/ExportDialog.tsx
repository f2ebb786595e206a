/**
 * The Export dialog (top bar, "Export"): the facsimile's options, a live preview of
 * facsimile.svg, and one button per export file plus "Save all". The files are written
 * in a Web Worker (export.worker.ts) by the same exportFiles the CLI calls, so the editor
 * and `inkroute export` give the same bytes; a job that takes longer than a moment shows
 * its progress and a Cancel button. Bad input (ExportError) is said in one sentence and
 * nothing is downloaded; exports never change the project.
 */
import { useEffect, useMemo, useRef, useState, type KeyboardEvent } from 'react';
import type { ExportOptions } from '../../src/export/exportFiles.ts';
import { EXPORT_FILES, ExportError, type ExportKind, type FacsimileOptions, type RestoredStyle } from '../../src/export/types.ts';
import { currentSurface } from '../canvas/view.ts';
import { useEditor } from '../store/useEditor.ts';
import { downloadExport } from './download.ts';
import { ExportCancelled, ExportClient } from './exportClient.ts';
import './export.css';

/** How long a job runs before its progress and Cancel show, ms. */
const SHOW_PROGRESS_AFTER_MS = 300;
/** Option changes are gathered this long before the preview is redrawn, ms. */
const PREVIEW_DEBOUNCE_MS = 150;

const KINDS = Object.keys(EXPORT_FILES) as ExportKind[];
const SCALES = [1, 2, 5] as const;
const DPIS = [300, 600, 1200] as const;
/** Scale bar lengths offered, mm. */
const SCALE_BARS = [10, 20, 50, 100] as const;

/** What the person chose in the dialog. */
export interface ExportChoices {
  scale: number;
  /** Scale bar length, mm; 0 for none; undefined for the default length. */
  scaleBarMm: number | undefined;
  restoredStyle: RestoredStyle;
  labels: boolean;
  lineNumbers: boolean;
  /** Image id of the band drawn underneath; '' for none. */
  photoImageId: string;
  dpi: number;
  transparent: boolean;
  /** Letter crop margin as typed (mm, or px on an uncalibrated surface). */
  margin: string;
}

export const DEFAULT_CHOICES: ExportChoices = {
  scale: 1, scaleBarMm: undefined, restoredStyle: 'dashed', labels: false, lineNumbers: false, photoImageId: '', dpi: 300, transparent: false, margin: '2',
};

/** The facsimile options of the choices (the preview's and the SVG's). */
export function facsimileOptionsOf(c: ExportChoices): FacsimileOptions {
  const o: FacsimileOptions = { scale: c.scale, restoredStyle: c.restoredStyle, labels: c.labels, lineNumbers: c.lineNumbers };
  if (c.photoImageId) o.photoImageId = c.photoImageId;
  if (c.scaleBarMm !== undefined) o.scaleBarMm = c.scaleBarMm;
  return o;
}

/** The letter crop margin, or the sentence that says why it cannot be used. */
export function parseMargin(text: string): { margin: number } | { error: string } {
  const v = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(v) || v < 0) return { error: 'The letter crop margin must be a number of 0 or more.' };
  return { margin: v };
}

/** The export options of the choices; undefined with the reason when the margin is unusable. */
export function exportOptionsOf(c: ExportChoices): { options: ExportOptions } | { error: string } {
  const m = parseMargin(c.margin);
  if ('error' in m) return m;
  const facsimile = facsimileOptionsOf(c);
  return {
    options: {
      facsimile,
      png: { ...facsimile, dpi: c.dpi, background: c.transparent ? 'transparent' : 'white' },
      letters: { margin: m.margin },
    },
  };
}

interface Job {
  label: string;
  startedAt: number;
  done: number;
  total: number;
}

/** The preview: the last drawn SVG (kept while the next is prepared) and what is under way. */
interface Preview {
  url?: string;
  status: 'preparing' | 'ready' | 'failed' | 'stopped';
  /** Why it failed. */
  text?: string;
}

/** Re-renders every 100 ms while `on`, for the job's elapsed time. */
function useTicker(on: boolean): number {
  const [now, setNow] = useState(() => performance.now());
  useEffect(() => {
    if (!on) return;
    const t = setInterval(() => setNow(performance.now()), 100);
    return () => clearInterval(t);
  }, [on]);
  return now;
}

export interface ExportDialogProps {
  open: boolean;
  onClose(): void;
}

export function ExportDialog({ open, onClose }: ExportDialogProps) {
  if (!open) return null;
  return <ExportDialogBody onClose={onClose} />;
}

function ExportDialogBody({ onClose }: { onClose(): void }) {
  const project = useEditor((s) => s.project);
  const images = useEditor((s) => s.images);
  const surface = currentSurface(project);
  const surfaceId = surface?.id;
  const calibrated = Boolean(surface?.pxPerMm);
  const [choices, setChoices] = useState<ExportChoices>(DEFAULT_CHOICES);
  const set = (patch: Partial<ExportChoices>) => setChoices((c) => ({ ...c, ...patch }));
  const [preview, setPreview] = useState<Preview>({ status: 'preparing' });
  const [previewStartedAt, setPreviewStartedAt] = useState(0);
  const [job, setJob] = useState<Job | undefined>();
  const [problem, setProblem] = useState<string | undefined>();
  const [saved, setSaved] = useState<string | undefined>();
  const dialog = useRef<HTMLDivElement>(null);

  // Two workers: a slow preview never holds up a save, and cancelling one leaves the other.
  const clients = useMemo(() => ({ preview: new ExportClient(), files: new ExportClient() }), []);
  useEffect(() => () => {
    clients.preview.dispose();
    clients.files.dispose();
  }, [clients]);

  useEffect(() => {
    dialog.current?.focus();
  }, []);

  // Keys while the dialog is open are its own, wherever the focus is (a disabled Save
  // button drops it to the page): Esc closes, and the canvas's tools never see a key.
  const close = useRef(onClose);
  close.current = onClose;
  useEffect(() => {
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (e.key === 'Escape') {
        e.preventDefault();
        e.stopPropagation();
        close.current();
      } else if (!(e.target instanceof Node && dialog.current?.contains(e.target))) {
        e.stopPropagation();
      }
    };
    window.addEventListener('keydown', onKey, { capture: true });
    return () => window.removeEventListener('keydown', onKey, { capture: true });
  }, []);

  const previewOptions = useMemo(() => facsimileOptionsOf(choices), [choices]);
  const [previewRun, setPreviewRun] = useState(0);

  // The preview follows the options and the project, a moment after the last change.
  useEffect(() => {
    if (!project) return;
    let live = true;
    setPreview((p) => ({ url: p.url, status: 'preparing' }));
    const timer = setTimeout(() => {
      setPreviewStartedAt(performance.now());
      // Only the newest preview matters: an older one still running is dropped.
      clients.preview.cancel();
      clients.preview.preview(project, images, surfaceId, previewOptions).then((svg) => {
        if (!live) return;
        const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
        setPreview({ url, status: 'ready' });
      }, (e: Error) => {
        if (!live || e instanceof ExportCancelled) return;
        setPreview({ status: 'failed', text: e instanceof ExportError ? e.message : `The preview could not be drawn: ${e.message}` });
      });
    }, PREVIEW_DEBOUNCE_MS);
    return () => {
      live = false;
      clearTimeout(timer);
    };
  }, [clients, project, images, surfaceId, previewOptions, previewRun]);

  // A replaced or closed preview gives its Blob URL back.
  useEffect(() => {
    const url = preview.url;
    return () => {
      if (url) URL.revokeObjectURL(url);
    };
  }, [preview.url]);

  const now = useTicker(Boolean(job) || preview.status === 'preparing');

  const save = async (kinds: ExportKind[]) => {
    if (!project || job) return;
    setProblem(undefined);
    setSaved(undefined);
    // The margin matters to letters.zip only; the other files never wait on it.
    const opts = exportOptionsOf(kinds.includes('letters') ? choices : { ...choices, margin: DEFAULT_CHOICES.margin });
    if ('error' in opts) {
      setProblem(opts.error);
      return;
    }
    const { options } = opts;
    const problems: string[] = [];
    const written: string[] = [];
    const startedAt = performance.now();
    try {
      // One file at a time: a file that cannot be made says why and the others still come.
      for (let i = 0; i < kinds.length; i++) {
        const name = EXPORT_FILES[kinds[i]];
        setJob({ label: `Preparing ${name}…`, startedAt, done: i, total: kinds.length });
        try {
          const files = await clients.files.files(project, images, surfaceId, [kinds[i]], options);
          const bytes = files.get(name);
          if (!bytes) throw new Error(`the export gave no ${name}.`);
          downloadExport(name, bytes);
          written.push(name);
        } catch (e) {
          if (e instanceof ExportCancelled) throw e;
          problems.push(e instanceof ExportError ? `${name}: ${e.message}` : `${name} could not be written: ${(e as Error).message}`);
        }
      }
    } catch (e) {
      if (!(e instanceof ExportCancelled)) throw e;
      problems.push(written.length ? `Cancelled after ${written.join(', ')}.` : 'Cancelled; nothing was saved.');
    } finally {
      setJob(undefined);
    }
    if (problems.length) setProblem(problems.join(' '));
    if (written.length) setSaved(`Saved ${written.join(', ')}.`);
  };

  const onKeyDown = (e: KeyboardEvent) => {
    // Keys typed here are the dialog's: the canvas's tools never see them (Esc: see above).
    e.stopPropagation();
  };

  const marginUnit = calibrated ? 'mm' : 'px';
  const marginCheck = parseMargin(choices.margin);
  const jobShown = job && now - job.startedAt >= SHOW_PROGRESS_AFTER_MS;
  const previewSlow = preview.status === 'preparing' && previewStartedAt > 0 && now - previewStartedAt >= SHOW_PROGRESS_AFTER_MS;

  return (
    <div className="export-backdrop" onKeyDown={onKeyDown}>
      <div className="export-dialog" role="dialog" aria-modal="true" aria-labelledby="export-title" tabIndex={-1} ref={dialog}>
        <header className="export-head">
          <h2 id="export-title">Export</h2>
          <button type="button" onClick={onClose}>Close</button>
        </header>
        <p className="export-note" role="note">
          A facsimile is an interpretation: inked strokes are what was traced on visible ink; restored spans
          (dashed or grey) are the editor's restoration.
        </p>
        {!calibrated && (
          <p className="export-warning">
            This surface has no scale yet: a true-scale facsimile, the scale bar and sizes in mm need it (use Calibrate).
          </p>
        )}
        <div className="export-body">
          <section className="export-preview" aria-label="Preview of facsimile.svg">
            {preview.url && preview.status !== 'failed' && (
              <img src={preview.url} alt="Preview of facsimile.svg" className={preview.status === 'ready' ? undefined : 'export-stale'} />
            )}
            {preview.status === 'preparing' && (
              <p className="export-preparing" role="status">
                Preparing the preview…
                {previewSlow && (
                  <>
                    {' '}<progress aria-label="Preparing the preview" />
                    <button type="button" onClick={() => { clients.preview.cancel(); setPreview((p) => ({ url: p.url, status: 'stopped' })); }}>Cancel</button>
                  </>
                )}
              </p>
            )}
            {preview.status === 'failed' && <p className="export-preview-problem" role="status">{preview.text}</p>}
            {preview.status === 'stopped' && (
              <p role="status">
                The preview was stopped{preview.url ? ' (the one shown is out of date)' : ''}.{' '}
                <button type="button" onClick={() => setPreviewRun((n) => n + 1)}>Draw it again</button>
              </p>
            )}
          </section>
          <form className="export-options" onSubmit={(e) => e.preventDefault()}>
            <fieldset>
              <legend>Facsimile</legend>
              <label>
                Scale{' '}
                <select value={choices.scale} onChange={(e) => set({ scale: Number(e.target.value) })}>
                  {SCALES.map((s) => <option key={s} value={s}>{`${s}:1`}</option>)}
                </select>
              </label>
              <label>
                Scale bar{' '}
                <select
                  value={choices.scaleBarMm === undefined ? 'auto' : String(choices.scaleBarMm)}
                  onChange={(e) => set({ scaleBarMm: e.target.value === 'auto' ? undefined : Number(e.target.value) })}
                >
                  <option value="auto">about a fifth of the width</option>
                  {SCALE_BARS.map((mm) => <option key={mm} value={String(mm)}>{mm} mm</option>)}
                  <option value="0">none</option>
                </select>
              </label>
              <div role="radiogroup" aria-label="Restored spans" className="export-radios">
                <span>Restored spans</span>
                <label><input type="radio" name="restored" checked={choices.restoredStyle === 'dashed'} onChange={() => set({ restoredStyle: 'dashed' })} /> dashed outline</label>
                <label><input type="radio" name="restored" checked={choices.restoredStyle === 'grey'} onChange={() => set({ restoredStyle: 'grey' })} /> grey</label>
              </div>
              <label><input type="checkbox" checked={choices.labels} onChange={(e) => set({ labels: e.target.checked })} /> Letter labels</label>
              <label><input type="checkbox" checked={choices.lineNumbers} onChange={(e) => set({ lineNumbers: e.target.checked })} /> Line numbers</label>
              <label>
                Photo underneath{' '}
                <select value={choices.photoImageId} onChange={(e) => set({ photoImageId: e.target.value })}>
                  <option value="">none</option>
                  {surface?.images.map((img) => <option key={img.id} value={img.id}>{img.band}</option>)}
                </select>
              </label>
            </fieldset>
            <fieldset>
              <legend>facsimile.png</legend>
              <label>
                PNG resolution{' '}
                <select value={choices.dpi} onChange={(e) => set({ dpi: Number(e.target.value) })}>
                  {DPIS.map((d) => <option key={d} value={d}>{`${d} dpi`}</option>)}
                </select>
              </label>
              <label><input type="checkbox" checked={choices.transparent} onChange={(e) => set({ transparent: e.target.checked })} /> transparent background</label>
            </fieldset>
            <fieldset>
              <legend>letters.zip</legend>
              <label>
                {`Letter crop margin (${marginUnit})`}{' '}
                <input
                  type="number" min={0} step={0.5} value={choices.margin} aria-invalid={'error' in marginCheck}
                  onChange={(e) => set({ margin: e.target.value })}
                />
              </label>
              {'error' in marginCheck && <p className="export-field-problem">{marginCheck.error}</p>}
            </fieldset>
          </form>
        </div>
        <div className="export-buttons">
          {KINDS.map((k) => (
            <button key={k} type="button" disabled={!project || Boolean(job)} onClick={() => void save([k])}>
              {`Save ${EXPORT_FILES[k]}`}
            </button>
          ))}
          <button type="button" className="export-all" disabled={!project || Boolean(job)} onClick={() => void save(KINDS)}>Save all</button>
        </div>
        {job && (
          <p className="export-job" role="status">
            {job.label}
            {jobShown && (
              <>
                {' '}
                {job.total > 1
                  ? <progress max={job.total} value={job.done} aria-label={job.label} />
                  : <progress aria-label={job.label} />}
                {job.total > 1 && ` ${job.done} of ${job.total} files`}
                {' '}<button type="button" onClick={() => clients.files.cancel()}>Cancel</button>
              </>
            )}
          </p>
        )}
        {problem && <p className="export-problem" role="alert">{problem}</p>}
        {saved && <p className="export-saved" role="status">{saved}</p>}
      </div>
    </div>
  );
}
