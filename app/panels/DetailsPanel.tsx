/**
 * The right panel: figures of the selected strokes and the solver settings. The sliders
 * act on the selected stroke (re-solved live while dragging) or on the defaults for new
 * strokes; one drag is one undo step (SettingsEdit in resolve.ts).
 */
import { useMemo, useState } from 'react';
import type { SolverSettings, StrokeDoc } from '../../src/doc/model.ts';
import { meanWidth, restoredShare, settingsOf, strokeLength } from '../../src/doc/rules.ts';
import { useEditor } from '../store/useEditor.ts';
import { formatCost, formatLength, formatShare, formatWidth } from './format.ts';
import { SettingsEdit } from './resolve.ts';
import { StrokeMarks } from './StrokeMarks.tsx';
import './panels.css';

type Mode = 'stroke' | 'defaults';

/** A slider of the solver settings; its label is its accessible name. */
interface SliderSpec {
  label: string;
  hint: string;
  min: number;
  max: number;
  step: number;
  get(s: SolverSettings): number;
  set(s: SolverSettings, v: number): SolverSettings;
}

const RADIUS_GAP = 0.5;

const SLIDERS: SliderSpec[] = [
  {
    label: 'Stay on ink', hint: 'How strongly the pen keeps to the ink (adherence)',
    min: 0, max: 5, step: 0.05,
    get: (s) => s.weights.adherence,
    set: (s, v) => ({ ...s, weights: { ...s.weights, adherence: v } }),
  },
  {
    label: 'Steady width', hint: 'Cost of each px the pen radius changes (width change)',
    min: 0, max: 10, step: 0.1,
    get: (s) => s.weights.widthChange,
    set: (s, v) => ({ ...s, weights: { ...s.weights, widthChange: v } }),
  },
  {
    label: 'Smooth turns', hint: 'Cost of sharp turns (curvature)',
    min: 0, max: 20, step: 0.1,
    get: (s) => s.weights.curvature,
    set: (s, v) => ({ ...s, weights: { ...s.weights, curvature: v } }),
  },
  {
    label: 'Min radius (px)', hint: 'Smallest pen radius the solver may use, px',
    min: 0.5, max: 20, step: 0.5,
    get: (s) => s.radius[0],
    // The range must stay non-empty (0 < min < max): the other end gives way.
    set: (s, v) => ({ ...s, radius: [v, Math.max(s.radius[1], v + RADIUS_GAP)] }),
  },
  {
    label: 'Max radius (px)', hint: 'Largest pen radius the solver may use, px',
    min: 1, max: 40, step: 0.5,
    get: (s) => s.radius[1],
    set: (s, v) => ({ ...s, radius: [Math.max(0.5, Math.min(s.radius[0], v - RADIUS_GAP)), v] }),
  },
];

interface Figures {
  length: number;
  width: number;
  restored: number;
  anchors: number;
  cost: StrokeDoc['cost'];
}

/** Figures of one or more strokes: sums, and means weighted by length or by sample. */
function figuresOf(strokes: StrokeDoc[]): Figures {
  let length = 0, restored = 0, widthSum = 0, samples = 0, anchors = 0;
  const cost = { adherence: 0, widthChange: 0, curvature: 0, length: 0, total: 0 };
  for (const st of strokes) {
    const len = strokeLength(st);
    length += len;
    restored += restoredShare(st) * len;
    widthSum += meanWidth(st) * st.samples.length;
    samples += st.samples.length;
    anchors += st.anchors.length;
    for (const k of Object.keys(cost) as (keyof typeof cost)[]) cost[k] += st.cost[k];
  }
  return { length, width: samples ? widthSum / samples : 0, restored: length ? restored / length : 0, anchors, cost };
}

/**
 * Starts a slider gesture; it ends on the next pointer up anywhere, since the pointer is
 * often released outside the slider after a long drag.
 */
function pressSlider(edit: SettingsEdit): void {
  edit.press();
  const release = () => {
    window.removeEventListener('pointerup', release, true);
    window.removeEventListener('pointercancel', release, true);
    edit.release();
  };
  window.addEventListener('pointerup', release, true);
  window.addEventListener('pointercancel', release, true);
}

export function DetailsPanel() {
  const project = useEditor((s) => s.project);
  const selection = useEditor((s) => s.selection);
  const [mode, setMode] = useState<Mode>('stroke');
  // One controller for the panel's life: it holds the open gesture between events.
  const edit = useMemo(() => new SettingsEdit(), []);

  const strokes = project ? selection.map((id) => project.strokes[id]).filter((s): s is StrokeDoc => Boolean(s)) : [];
  const order = new Map<string, number>();
  for (const surface of project?.surfaces ?? []) surface.strokeOrder.forEach((id, i) => order.set(id, i + 1));
  const pxPerMm = strokes.length ? project?.surfaces.find((s) => s.id === strokes[0].surfaceId)?.pxPerMm : project?.surfaces[0]?.pxPerMm;
  const effective: Mode = strokes.length === 0 ? 'defaults' : mode;
  const shown: SolverSettings | undefined = project && (effective === 'stroke' ? settingsOf(project, strokes[0].id) : project.defaults);
  const ownSettings = strokes.filter((s) => s.settings).map((s) => s.id);

  const apply = (settings: SolverSettings) => {
    void edit.apply(effective === 'stroke' ? { kind: 'strokes', ids: strokes.map((s) => s.id) } : { kind: 'defaults' }, settings);
  };

  return (
    <aside className="panel details-panel" aria-label="Details">
      <section aria-labelledby="details-heading">
        <div className="panel-head">
          <h2 id="details-heading">Details</h2>
        </div>
        {strokes.length === 0 ? (
          <p className="panel-empty">{project ? 'No stroke selected: click one in the list or on the photo.' : 'No project open.'}</p>
        ) : (
          <SelectionFigures strokes={strokes} numbers={strokes.map((s) => order.get(s.id) ?? 0)} pxPerMm={pxPerMm} />
        )}
      </section>

      {project && shown && (
        <section aria-labelledby="settings-heading" className="solver-settings">
          <div className="panel-head">
            <h2 id="settings-heading">Solver settings</h2>
          </div>
          <fieldset className="settings-target">
            <legend>Apply to</legend>
            <label>
              <input type="radio" name="settings-target" checked={effective === 'stroke'} disabled={strokes.length === 0} onChange={() => setMode('stroke')} />
              {strokes.length > 1 ? `these ${strokes.length} strokes` : 'this stroke'}
            </label>
            <label>
              <input type="radio" name="settings-target" checked={effective === 'defaults'} onChange={() => setMode('defaults')} />
              default for new strokes
            </label>
          </fieldset>
          {SLIDERS.map((spec) => {
            const value = spec.get(shown);
            const id = `setting-${spec.label.replace(/\W+/g, '-').toLowerCase()}`;
            return (
              <div key={spec.label} className="setting">
                <label htmlFor={id} title={spec.hint}>{spec.label}</label>
                <input
                  id={id}
                  type="range"
                  min={spec.min}
                  max={spec.max}
                  step={spec.step}
                  value={value}
                  onPointerDown={() => pressSlider(edit)}
                  onChange={(e) => apply(spec.set(shown, Number(e.currentTarget.value)))}
                />
                <output htmlFor={id}>{value.toFixed(spec.step < 0.1 ? 2 : 1)}</output>
              </div>
            );
          })}
          {effective === 'stroke' && (
            <p className="settings-note">
              {ownSettings.length === 0 ? 'Follows the defaults.' : (
                <>
                  Has its own settings.{' '}
                  <button type="button" onClick={() => void edit.useDefaults(ownSettings)}>Use defaults</button>
                </>
              )}
            </p>
          )}
        </section>
      )}
    </aside>
  );
}

function SelectionFigures({ strokes, numbers, pxPerMm }: { strokes: StrokeDoc[]; numbers: number[]; pxPerMm: number | undefined }) {
  const f = figuresOf(strokes);
  const one = strokes.length === 1 ? strokes[0] : undefined;
  return (
    <>
      <p className="selection-title">{one ? `Stroke ${numbers[0]}` : `${strokes.length} strokes (${numbers.join(', ')})`}</p>
      <dl className="figures">
        <dt>Length</dt><dd>{formatLength(f.length, pxPerMm)}</dd>
        <dt>Mean width</dt><dd>{formatWidth(f.width, pxPerMm)}</dd>
        <dt>Restored</dt><dd>{formatShare(f.restored)}</dd>
        <dt>Anchors</dt><dd>{f.anchors}</dd>
      </dl>
      <h3>Solver cost</h3>
      <dl className="figures cost">
        <dt>Stay on ink</dt><dd>{formatCost(f.cost.adherence)}</dd>
        <dt>Steady width</dt><dd>{formatCost(f.cost.widthChange)}</dd>
        <dt>Smooth turns</dt><dd>{formatCost(f.cost.curvature)}</dd>
        <dt>Length</dt><dd>{formatCost(f.cost.length)}</dd>
        <dt>Total</dt><dd>{formatCost(f.cost.total)}</dd>
      </dl>
      {one && <StrokeMarks stroke={one} />}
    </>
  );
}
