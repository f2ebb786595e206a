/**
 * The left panel: the strokes in ductus order (the order of writing) with their figures,
 * selection, hiding, deleting and reordering; the Letters list below (LettersPanel). Every edit is
 * one store.change, so one undo step.
 */
import { useState } from 'react';
import type { Project } from '../../src/doc/model.ts';
import { deleteStrokes, meanWidth, moveStroke, restoredShare, setHidden, strokeLength } from '../../src/doc/rules.ts';
import { editorStore, useEditor } from '../store/useEditor.ts';
import { formatLength, formatShare, formatWidth } from './format.ts';
import { LettersPanel } from './LettersPanel.tsx';
import './panels.css';

/** Where a dragged stroke goes: before or after the row under the pointer. */
interface DropMark {
  id: string;
  after: boolean;
}

/** The index to give moveStroke: a position in the order without the dragged stroke. */
function dropIndex(order: readonly string[], dragged: string, mark: DropMark): number {
  const rest = order.filter((id) => id !== dragged);
  const at = rest.indexOf(mark.id);
  return at < 0 ? rest.length : at + (mark.after ? 1 : 0);
}

export function StrokesPanel() {
  const project = useEditor((s) => s.project);
  const selection = useEditor((s) => s.selection);
  const showDuctus = useEditor((s) => s.showDuctus);
  const [dragged, setDragged] = useState<string>();
  const [mark, setMark] = useState<DropMark>();

  const change = (fn: (p: Project) => Project) => editorStore.getState().change(fn);
  const selected = new Set(selection);
  const many = (project?.surfaces.length ?? 0) > 1;

  return (
    <aside className="panel strokes-panel" aria-label="Strokes and letters">
      <section aria-labelledby="strokes-heading">
        <div className="panel-head">
          <h2 id="strokes-heading">Strokes</h2>
          <label className="panel-toggle">
            <input
              type="checkbox"
              checked={showDuctus}
              onChange={(e) => editorStore.getState().setView({ showDuctus: e.currentTarget.checked })}
            />
            Show ductus
          </label>
        </div>
        {!project ? <p className="panel-empty">No project open.</p> : project.surfaces.map((surface) => (
          <div key={surface.id} className="surface-strokes">
            {many && <h3>{surface.name}</h3>}
            {surface.strokeOrder.length === 0 ? (
              <p className="panel-empty">No strokes yet: trace one with Follow.</p>
            ) : (
              <ol className="stroke-list">
                {surface.strokeOrder.map((id, i) => {
                  const st = project.strokes[id];
                  if (!st) return null;
                  const n = i + 1;
                  const last = i === surface.strokeOrder.length - 1;
                  const classes = ['stroke-row'];
                  if (selected.has(id)) classes.push('selected');
                  if (st.hidden) classes.push('hidden-stroke');
                  if (dragged === id) classes.push('dragging');
                  if (mark?.id === id && dragged && dragged !== id) classes.push(mark.after ? 'drop-after' : 'drop-before');
                  return (
                    <li
                      key={id}
                      className={classes.join(' ')}
                      data-stroke-id={id}
                      draggable
                      onDragStart={(e) => {
                        e.dataTransfer.effectAllowed = 'move';
                        // A type of our own, so the window's file drop ignores it.
                        e.dataTransfer.setData('application/x-inkroute-stroke', id);
                        setDragged(id);
                      }}
                      onDragOver={(e) => {
                        if (!dragged || project.strokes[dragged]?.surfaceId !== surface.id) return;
                        e.preventDefault();
                        const box = e.currentTarget.getBoundingClientRect();
                        const after = e.clientY > box.top + box.height / 2;
                        if (mark?.id !== id || mark.after !== after) setMark({ id, after });
                      }}
                      onDrop={(e) => {
                        e.preventDefault();
                        if (dragged && mark && dragged !== mark.id) {
                          const to = dropIndex(surface.strokeOrder, dragged, mark);
                          if (surface.strokeOrder.indexOf(dragged) !== to) change((p) => moveStroke(p, dragged, to));
                        }
                        setDragged(undefined);
                        setMark(undefined);
                      }}
                      onDragEnd={() => {
                        setDragged(undefined);
                        setMark(undefined);
                      }}
                    >
                      <button
                        type="button"
                        className="stroke-pick"
                        aria-pressed={selected.has(id)}
                        title="Click to select; Shift+click to add to the selection"
                        onClick={(e) => editorStore.getState().select([id], e.shiftKey ? 'add' : e.ctrlKey || e.metaKey ? 'toggle' : 'replace')}
                      >
                        <span className="stroke-number">{n}</span>
                        <span className="stroke-figures">
                          <span title="Length of the centreline">{formatLength(strokeLength(st), surface.pxPerMm)}</span>
                          <span title="Mean pen width">⌀ {formatWidth(meanWidth(st), surface.pxPerMm)}</span>
                          <span title="Share of the length restored (no visible ink under the pen)">restored {formatShare(restoredShare(st))}</span>
                        </span>
                      </button>
                      <span className="stroke-actions">
                        <button
                          type="button"
                          aria-label={`${st.hidden ? 'Show' : 'Hide'} stroke ${n}`}
                          onClick={() => change((p) => setHidden(p, [id], !st.hidden))}
                        >
                          {st.hidden ? 'Show' : 'Hide'}
                        </button>
                        <button type="button" aria-label={`Move stroke ${n} up`} title="Earlier in the ductus" disabled={i === 0} onClick={() => change((p) => moveStroke(p, id, i - 1))}>↑</button>
                        <button type="button" aria-label={`Move stroke ${n} down`} title="Later in the ductus" disabled={last} onClick={() => change((p) => moveStroke(p, id, i + 1))}>↓</button>
                        <button type="button" aria-label={`Delete stroke ${n}`} title="Delete" onClick={() => change((p) => deleteStrokes(p, [id]))}>✕</button>
                      </span>
                    </li>
                  );
                })}
              </ol>
            )}
          </div>
        ))}
      </section>
      <LettersPanel />
    </aside>
  );
}
