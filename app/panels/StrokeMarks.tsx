/**
 * The Details panel's hand controls of one stroke: pin the pen radius at an anchor (or
 * free it), and mark the span between two anchors as restored or inked, overriding the
 * measured ink support. Each change is one undo step (app/tools/refine/actions.ts).
 */
import { useState } from 'react';
import type { SpanOverride, StrokeDoc } from '../../src/doc/model.ts';
import { effectiveRestoredSpans } from '../../src/doc/rules.ts';
import { markSpan, pinRadius, spanMarking, type SpanMarking } from '../tools/index.ts';
import { anchorSampleIndices } from '../tools/shared.ts';
import { formatShare } from './format.ts';

function anchorName(i: number, count: number): string {
  return i === 0 ? 'start' : i === count - 1 ? 'end' : `anchor ${i + 1}`;
}

const MARKING_TEXT: Record<SpanMarking, string> = {
  measured: 'as measured',
  restored: 'restored (by hand)',
  inked: 'inked (by hand)',
  mixed: 'partly by hand',
};

/** Share of samples `from`..`to` the stroke shows as restored (measured or by hand). */
function shownRestored(stroke: StrokeDoc, from: number, to: number): number {
  let n = 0;
  for (const s of effectiveRestoredSpans(stroke)) n += Math.max(0, Math.min(to, s.to) - Math.max(from, s.from) + 1);
  return to >= from ? n / (to - from + 1) : 0;
}

export function StrokeMarks({ stroke }: { stroke: StrokeDoc }) {
  // A pin re-solves the stroke in the worker; its buttons wait for it.
  const [busy, setBusy] = useState(false);
  const at = anchorSampleIndices(stroke.anchors, stroke.samples);
  const count = stroke.anchors.length;

  const pin = (i: number, r: number | undefined) => {
    setBusy(true);
    void pinRadius(stroke.id, i, r).finally(() => setBusy(false));
  };
  const mark = (from: number, to: number, value: string) => {
    markSpan(stroke.id, from, to, value === 'measured' ? undefined : (value as SpanOverride['kind']));
  };

  return (
    <>
      <h3>Anchors</h3>
      <ol className="anchor-list">
        {stroke.anchors.map((a, i) => {
          const name = anchorName(i, count);
          const solved = stroke.samples[at[i]]?.r;
          return (
            <li key={i} className="anchor-row">
              <span>{name}: </span>
              {a.r !== undefined ? (
                <>
                  <span>radius pinned at</span>
                  <PinnedRadius
                    label={`Pinned radius at ${name}, px`}
                    value={a.r}
                    disabled={busy}
                    onCommit={(r) => pin(i, r)}
                  />
                  <span>px</span>
                  <button type="button" disabled={busy} onClick={() => pin(i, undefined)} title="Let the solver choose the pen radius here again">
                    Free
                  </button>
                </>
              ) : (
                <>
                  <span>radius free{solved !== undefined ? ` (${solved.toFixed(1)} px)` : ''}</span>
                  <button
                    type="button"
                    disabled={busy || solved === undefined}
                    onClick={() => solved !== undefined && pin(i, solved)}
                    title="Hold the pen radius here at its current width; edit the number after"
                    aria-label={`Pin radius at ${name}`}
                  >
                    Pin
                  </button>
                </>
              )}
            </li>
          );
        })}
      </ol>

      <h3>Spans</h3>
      <p className="marks-note">Mark a span restored or inked where the measured ink misleads; the mark overrides the measurement and is kept through re-solves.</p>
      <ul className="span-list">
        {at.slice(0, -1).map((from, k) => {
          const to = at[k + 1];
          const name = `${anchorName(k, count)} – ${anchorName(k + 1, count)}`;
          const marking = spanMarking(stroke, from, to);
          return (
            <li key={k} className={`span-row${marking !== 'measured' ? ' overridden' : ''}`}>
              <span className="span-name">{name}</span>
              <span className="span-share">{formatShare(shownRestored(stroke, from, to))} restored</span>
              <select
                aria-label={`Span ${name}`}
                value={marking}
                onChange={(e) => mark(from, to, e.currentTarget.value)}
              >
                {marking === 'mixed' && <option value="mixed" disabled>{MARKING_TEXT.mixed}</option>}
                <option value="measured">{MARKING_TEXT.measured}</option>
                <option value="restored">{MARKING_TEXT.restored}</option>
                <option value="inked">{MARKING_TEXT.inked}</option>
              </select>
            </li>
          );
        })}
      </ul>
      {stroke.overrides.length > 0 && (
        <>
          <h3>Marked by hand</h3>
          <ul className="override-list">
            {stroke.overrides.map((o, i) => (
              <li key={i}>
                samples {o.from}–{o.to}: overridden as {o.kind}{' '}
                <button type="button" onClick={() => markSpan(stroke.id, o.from, o.to, undefined)} aria-label={`Remove the mark on samples ${o.from}–${o.to}`}>
                  Remove
                </button>
              </li>
            ))}
          </ul>
        </>
      )}
    </>
  );
}

/** A number field that commits on Enter or when it loses focus; Esc puts the value back. */
function PinnedRadius({ label, value, disabled, onCommit }: { label: string; value: number; disabled: boolean; onCommit(r: number): void }) {
  const [text, setText] = useState<string | undefined>(undefined);
  const shown = text ?? value.toFixed(2);
  const commit = () => {
    if (text === undefined) return;
    setText(undefined);
    const r = Number(text);
    if (r !== value) onCommit(r); // pinRadius says why a bad number is refused
  };
  return (
    <input
      className="pinned-radius"
      type="number"
      step={0.1}
      min={0.1}
      aria-label={label}
      value={shown}
      disabled={disabled}
      onChange={(e) => setText(e.currentTarget.value)}
      onBlur={commit}
      onKeyDown={(e) => {
        if (e.key === 'Enter') commit();
        else if (e.key === 'Escape') setText(undefined);
      }}
    />
  );
}
