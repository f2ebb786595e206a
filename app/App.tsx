/**
 * The editor's screen (naming.md, "Screen"): the top bar in working order, the Strokes
 * and Letters lists on the left, the canvas in the centre, Details and the solver
 * settings on the right, the status strip below. On start, unsaved work kept by the
 * browser is offered back (persist/startup.ts); otherwise the demo inscription opens.
 */
import { useEffect, useState } from 'react';
import { useStore } from 'zustand';
import { newProject } from '../src/doc/rules.ts';
import type { InscriptionTruth } from '../src/synth/types.ts';
import { InkCanvas } from './canvas/InkCanvas.tsx';
import { ToolForms } from './canvas/ToolForms.tsx';
import { activeTool, setPanHeld, switchTool } from './canvas/tools.ts';
import { actualSize, fitToWindow } from './canvas/view.ts';
import { DetailsPanel } from './panels/DetailsPanel.tsx';
import { StatusStrip } from './panels/StatusStrip.tsx';
import { StrokesPanel } from './panels/StrokesPanel.tsx';
import { ExportDialog } from './export/ExportDialog.tsx';
import { FileButtons } from './persist/FileButtons.tsx';
import { RestoreOffer } from './persist/RestoreOffer.tsx';
import { startup } from './persist/startup.ts';
import type { ToolName } from './store/store.ts';
import { editorStore, useEditor } from './store/useEditor.ts';
import { KeySheet } from './tools/KeySheet.tsx';
import { handleKey } from './tools/keys.ts';

const DEMO = `${import.meta.env.BASE_URL}demo/`;

/** The demo inscription's ground truth (the test hook hands it to the end-to-end tests). */
export async function fetchDemoTruth(): Promise<InscriptionTruth> {
  const res = await fetch(`${DEMO}truth.json`);
  if (!res.ok) throw new Error(`the demo inscription is missing (${res.status}); run npm run demo`);
  return (await res.json()) as InscriptionTruth;
}

/** Opens the demo inscription's visible band as a new project. */
async function loadDemo(): Promise<void> {
  const truth = await fetchDemoTruth();
  const res = await fetch(`${DEMO}visible.png`);
  if (!res.ok) throw new Error(`the demo photo is missing (${res.status}); run npm run demo`);
  const bytes = new Uint8Array(await res.arrayBuffer());
  const file = 'images/visible.png';
  const project = newProject(truth.title, {
    band: 'visible', file, mime: 'image/png', width: truth.width, height: truth.height, bitDepth: 8,
  }, truth.pxPerMm);
  editorStore.getState().loadProject(project, new Map([[file, bytes]]));
}

/** The working order of the top bar; the steps not built yet say so. */
const STEPS: { label: string; tool?: ToolName; key?: string }[] = [
  { label: 'Surfaces' },
  { label: 'Calibrate', tool: 'calibrate', key: 'C' },
  { label: 'Teach ink' },
  { label: 'Follow', tool: 'follow', key: 'F' },
  { label: 'Refine', tool: 'refine', key: 'R' },
  { label: 'Letter', tool: 'letter', key: 'L' },
  { label: 'Suggest' },
  { label: 'Export' },
];

/** Top-bar buttons leave the keyboard focus where it was, so Enter and Space keep going to the canvas. */
const keepFocus = (e: React.MouseEvent) => e.preventDefault();

function TopBar({ onExport }: { onExport(): void }) {
  const title = useEditor((s) => s.project?.title);
  const tool = useEditor((s) => s.tool);
  const hasProject = useEditor((s) => s.project !== undefined);
  const overlay = useEditor((s) => s.overlay);
  const overlayOpacity = useEditor((s) => s.overlayOpacity);
  const canUndo = useStore(editorStore.temporal, (t) => t.pastStates.length > 0);
  const canRedo = useStore(editorStore.temporal, (t) => t.futureStates.length > 0);
  const setView = editorStore.getState().setView;
  const history = (step: 'undo' | 'redo') => {
    const t = activeTool();
    // Mid-gesture, undo takes back the gesture only (as Ctrl+Z does).
    if (t && !t.path().endsWith('.idle')) t.cancel();
    else editorStore.getState()[step]();
  };

  return (
    <header className="bar">
      <span className="product">inkroute</span>
      <h1 className="find" title={title}>{title ?? 'Opening…'}</h1>
      <nav className="steps" aria-label="Working order">
        {STEPS.map((s) => (s.tool ? (
          <button
            key={s.label}
            type="button"
            className="step"
            aria-pressed={tool === s.tool}
            disabled={!hasProject}
            title={`${s.label} (${s.key})`}
            onMouseDown={keepFocus}
            onClick={() => switchTool(editorStore, s.tool!)}
          >
            {s.label}
          </button>
        ) : (
          s.label === 'Export'
            ? <button key={s.label} type="button" className="step" disabled={!hasProject} title="Export the facsimile, letters, chart, transcription and annotations" onClick={onExport}>{s.label}</button>
            : <button key={s.label} type="button" className="step" disabled title="comes later">{s.label}</button>
        )))}
      </nav>
      <span className="bar-group">
        <FileButtons />
      </span>
      <span className="bar-group">
        <button type="button" onMouseDown={keepFocus} onClick={() => history('undo')} disabled={!canUndo} title="Undo (Ctrl+Z)">Undo</button>
        <button type="button" onMouseDown={keepFocus} onClick={() => history('redo')} disabled={!canRedo} title="Redo (Ctrl+Shift+Z)">Redo</button>
      </span>
      <span className="bar-group">
        <button type="button" onMouseDown={keepFocus} onClick={() => fitToWindow()} disabled={!hasProject} title="Show the whole image">Fit</button>
        <button type="button" onMouseDown={keepFocus} onClick={() => actualSize()} disabled={!hasProject} title="One image pixel per screen pixel">1:1</button>
      </span>
      <span className="bar-group">
        <label className="toggle" title="Show the ink evidence: how strongly each pixel looks like ink">
          <input type="checkbox" checked={overlay} onChange={(e) => setView({ overlay: e.target.checked })} />
          Ink evidence
        </label>
        <input
          type="range" min={0.1} max={1} step={0.05} value={overlayOpacity} disabled={!overlay}
          aria-label="Ink evidence opacity" onChange={(e) => setView({ overlayOpacity: Number(e.target.value) })}
        />
      </span>
    </header>
  );
}

export function App() {
  const [keySheet, setKeySheet] = useState(false);
  const [exporting, setExporting] = useState(false);

  useEffect(() => {
    startup(loadDemo).catch((e: Error) => editorStore.getState().setMessage({ kind: 'error', text: `Could not open the demo: ${e.message}` }));
  }, []);

  useEffect(() => {
    const api = {
      store: editorStore,
      activeTool,
      switchTool: (t: ToolName) => switchTool(editorStore, t),
      toggleKeySheet: () => setKeySheet((v) => !v),
    };
    const onKey = (e: KeyboardEvent) => {
      const out = handleKey({
        key: e.key, ctrlKey: e.ctrlKey, metaKey: e.metaKey, shiftKey: e.shiftKey, altKey: e.altKey,
        type: e.type === 'keyup' ? 'keyup' : 'keydown', target: e.target,
      }, api);
      if (out.panHeld !== undefined) setPanHeld(out.panHeld);
      if (out.handled) e.preventDefault();
    };
    // Space released while the window was elsewhere would leave panning on.
    const onBlur = () => setPanHeld(false);
    window.addEventListener('keydown', onKey);
    window.addEventListener('keyup', onKey);
    window.addEventListener('blur', onBlur);
    return () => {
      window.removeEventListener('keydown', onKey);
      window.removeEventListener('keyup', onKey);
      window.removeEventListener('blur', onBlur);
    };
  }, []);

  return (
    <div className="page">
      <TopBar onExport={() => setExporting(true)} />
      <p className="note" role="note">
        A facsimile is an interpretation, not a copy: every traced stroke is a reading of the ink,
        and restored spans (parts of a stroke with no visible ink under the pen) are marked as restored,
        with a dashed outline and no fill.
      </p>
      <div className="workspace">
        <StrokesPanel />
        <main className="stage">
          <InkCanvas />
          <ToolForms />
        </main>
        <DetailsPanel />
      </div>
      <StatusStrip />
      <RestoreOffer />
      <KeySheet open={keySheet} onClose={() => setKeySheet(false)} />
      <ExportDialog open={exporting} onClose={() => setExporting(false)} />
    </div>
  );
}
