/**
 * The small forms the tools ask with, over the canvas's top-left corner: the ruler's
 * length after a Calibrate line, the lost letters of a lacuna being placed, and a hint
 * while a word divider or lacuna waits for its click. They sit beside the canvas, not in
 * it, so their clicks never reach the tools. Esc in a field cancels, as it does on the canvas.
 */
import { useEffect, useRef, type CSSProperties, type FormEvent, type KeyboardEvent } from 'react';
import { lineLength, type CalibrateTool } from '../tools/calibrate/calibrateTool.ts';
import type { LetterTool } from '../tools/letter/letterTool.ts';
import { useEditor } from '../store/useEditor.ts';
import { activeTool } from './tools.ts';

const box: CSSProperties = {
  position: 'absolute', top: 8, left: 8, zIndex: 2, display: 'flex', flexWrap: 'wrap', alignItems: 'center', gap: '0.4rem',
  maxWidth: 'calc(100% - 16px)', padding: '0.45rem 0.6rem', background: '#fff', color: '#1b1b1f',
  border: '2px solid #0f9d8a', borderRadius: 6, boxShadow: '0 2px 10px rgba(0, 0, 0, 0.2)', font: 'inherit', fontSize: '0.85rem',
};
const field: CSSProperties = { width: '5.5rem', font: 'inherit' };

function onEscape(cancel: () => void) {
  return (e: KeyboardEvent) => {
    if (e.key !== 'Escape') return;
    e.preventDefault();
    e.stopPropagation();
    cancel();
  };
}

function CalibrateForm() {
  const guide = useEditor((s) => s.guide);
  const input = useRef<HTMLInputElement>(null);
  const tool = () => activeTool() as CalibrateTool | undefined;
  useEffect(() => input.current?.focus(), []);
  const px = guide?.kind === 'ruler' ? lineLength(guide) : undefined;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    tool()?.submit(input.current?.value ?? '');
  };
  return (
    <form style={box} aria-label="Ruler length" onSubmit={submit} onKeyDown={onEscape(() => tool()?.cancel())}>
      <span>Line {px !== undefined ? `${px.toFixed(1)} px` : ''}</span>
      <label>
        Ruler length (mm){' '}
        <input ref={input} style={field} type="text" inputMode="decimal" autoComplete="off" name="ruler-mm" />
      </label>
      <button type="submit">Set scale</button>
      <button type="button" onClick={() => tool()?.cancel()}>Cancel</button>
    </form>
  );
}

function LacunaForm() {
  const input = useRef<HTMLInputElement>(null);
  const tool = () => activeTool() as LetterTool | undefined;
  useEffect(() => input.current?.focus(), []);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    tool()?.submitLost(input.current?.value ?? '');
  };
  return (
    <form style={box} aria-label="Lacuna" onSubmit={submit} onKeyDown={onEscape(() => tool()?.cancel())}>
      <label>
        Lost letters (about){' '}
        <input ref={input} style={field} type="text" inputMode="numeric" autoComplete="off" name="lost-letters" placeholder="unknown" />
      </label>
      <button type="submit">Place lacuna</button>
      <button type="button" onClick={() => tool()?.cancel()}>Cancel</button>
    </form>
  );
}

function PlacingHint() {
  const kind = (activeTool() as LetterTool | undefined)?.placing?.();
  return (
    <div style={box} role="status">
      Click on the photo to place the {kind === 'lacuna' ? 'lacuna' : 'word divider'}.
      <button type="button" onClick={() => activeTool()?.cancel()}>Cancel</button>
    </div>
  );
}

export function ToolForms() {
  const path = useEditor((s) => s.toolPath);
  if (path === 'calibrate.asking') return <CalibrateForm />;
  if (path === 'letter.asking') return <LacunaForm />;
  if (path === 'letter.placing') return <PlacingHint />;
  return null;
}
