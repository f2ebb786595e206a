/**
 * Letter (L): pick strokes by a click, Shift+click (add or remove) or a box dragged
 * around them (strokes whose centreline lies mostly inside), then Enter (or the button
 * "Make letter") makes them one letter, one undo step. A click inside a letter's box, off
 * any stroke, selects the letter (or a word divider or lacuna near its mark). "Add word
 * divider" and "Add lacuna" start placing one: a click on the photo puts it there; a
 * lacuna then asks how many letters are lost (empty: unknown).
 *
 *   idle ──down──▶ pointing ──moved > 3 screen px──▶ boxing ──up──▶ idle (strokes picked)
 *     │              └─up: a click (pick a stroke, a letter or a mark; on nothing: clear)
 *     ├─ startPlacing ──▶ placing ──down (divider)──▶ idle, one undo step
 *     │                     └─down (lacuna)──▶ asking ──submitLost──▶ idle, one undo step
 *     ├─ Enter: make a letter of the picks;  Delete: remove the selected letters and
 *     │  marks, or else the picked strokes
 *   Esc anywhere ──▶ idle, the document unchanged (in idle: the picks are cleared).
 */
import type { TextMark } from '../../../src/doc/model.ts';
import { addTextMark } from '../../../src/doc/rules.ts';
import { StateMachine, type StateNode } from '../machine.ts';
import { surfaceOfImage } from '../shared.ts';
import type { Tool, ToolContext, ToolEvent } from '../types.ts';
import { boxOf, letterAt, makeLetterOfPicked, markAt, strokesInBox } from './pick.ts';

export type LetterState = 'idle' | 'pointing' | 'boxing' | 'placing' | 'asking';

/** Pointer travel that turns a press into a box, screen px. */
export const BOX_THRESHOLD = 3;

export interface LetterTool extends Tool {
  /** Starts placing a word divider or a lacuna: the next click on the photo puts it there. */
  startPlacing(kind: TextMark['kind']): void;
  /** Adds the lacuna being asked about; `lostText` empty means unknown. Bad input: a message, nothing added. */
  submitLost(lostText: string): boolean;
  /** Makes the picked strokes one letter (as Enter); returns its id. */
  makeLetter(): string | undefined;
  /** The kind of mark being placed or asked about. */
  placing(): TextMark['kind'] | undefined;
}

/** The number of lost letters typed: undefined for unknown (empty), or a reason it is not usable. */
export function parseLost(text: string): { lost: number | undefined } | { error: string } {
  const t = text.trim();
  if (t === '') return { lost: undefined };
  const n = Number(t);
  if (!(Number.isInteger(n) && n > 0)) return { error: `"${t}" is not a whole number above 0; leave it empty when the number of lost letters is unknown.` };
  return { lost: n };
}

function isPrimary(ev: ToolEvent): boolean {
  return ev.button === undefined || ev.button === 0;
}

export function createLetterTool(ctx: ToolContext): LetterTool {
  const { store } = ctx;
  const st = () => store.getState();

  let press: { x: number; y: number; shift: boolean; stroke?: string; letter?: string; mark?: string } | undefined;
  let kind: TextMark['kind'] | undefined;
  let at: { x: number; y: number } | undefined;

  const surfaceId = (): string | undefined => {
    const p = st().project;
    return p ? surfaceOfImage(p, ctx.imageId())?.surface.id : undefined;
  };

  function toIdle(): void {
    press = undefined;
    kind = undefined;
    at = undefined;
    st().setToolView({ guide: undefined });
    void machine.go('idle');
  }

  function insideImage(x: number, y: number): boolean {
    const p = st().project;
    const found = p && surfaceOfImage(p, ctx.imageId());
    return !!found && x >= 0 && y >= 0 && x < found.image.width && y < found.image.height;
  }

  function place(lost: number | undefined): void {
    const sid = surfaceId();
    const point = at;
    const k = kind;
    if (!sid || !point || !k) return toIdle();
    let id: string | undefined;
    st().change((q) => {
      const made = addTextMark(q, sid, k, point, lost);
      id = made.id;
      return made.project;
    });
    st().select([]);
    if (id) st().selectLetters([id]);
    toIdle();
  }

  const idle: StateNode = {
    down(ev) {
      const p = st().project;
      const sid = surfaceId();
      if (!isPrimary(ev) || !p || !sid) return;
      const stroke = ctx.hitStroke(ev.x, ev.y, ctx.tolerance())?.strokeId;
      const mark = stroke ? undefined : markAt(p, sid, ev.x, ev.y, 2 * ctx.tolerance());
      const letter = stroke || mark ? undefined : letterAt(p, sid, ev.x, ev.y);
      press = { x: ev.x, y: ev.y, shift: !!ev.shift, stroke, letter, mark };
      return machine.go('pointing');
    },
    key(ev) {
      if (ev.key !== 'Delete' && ev.key !== 'Backspace') return;
      if (st().letterSelection.length > 0) st().deleteLetterSelection();
      else st().deleteSelection();
    },
    complete() {
      makeLetterOfPicked(store);
    },
    cancel() {
      // Nothing under way: Esc lets go of the picks (the document does not change).
      st().select([]);
      st().selectLetters([]);
      toIdle();
    },
  };

  const pointing: StateNode = {
    move(ev) {
      if (!press) return toIdle();
      if (Math.hypot(ev.x - press.x, ev.y - press.y) <= BOX_THRESHOLD / Math.max(1e-6, st().zoom)) return;
      void machine.go('boxing');
      return boxing.move!(ev);
    },
    up() {
      const pr = press;
      if (!pr) return toIdle();
      const s = st();
      if (pr.stroke) {
        s.selectLetters([]);
        s.select([pr.stroke], pr.shift ? 'toggle' : 'replace');
      } else if (pr.letter || pr.mark) {
        const id = (pr.letter ?? pr.mark)!;
        s.select([]);
        s.selectLetters([id], pr.shift ? 'toggle' : 'replace');
      } else if (!pr.shift) {
        s.select([]);
        s.selectLetters([]);
      }
      toIdle();
    },
    cancel: toIdle,
  };

  const boxing: StateNode = {
    move(ev) {
      if (!press) return toIdle();
      const [x0, y0, x1, y1] = boxOf(press, ev);
      st().setToolView({ guide: { kind: 'box', x0, y0, x1, y1 } });
    },
    up(ev) {
      const p = st().project;
      const sid = surfaceId();
      if (!press || !p || !sid) return toIdle();
      const ids = strokesInBox(p, sid, boxOf(press, ev));
      st().selectLetters([]);
      st().select(ids, press.shift ? 'add' : 'replace');
      toIdle();
    },
    cancel: toIdle,
  };

  const placing: StateNode = {
    move(ev) {
      if (kind) st().setToolView({ guide: { kind: 'mark', mark: kind, x: ev.x, y: ev.y } });
    },
    down(ev) {
      if (!isPrimary(ev) || !kind) return;
      if (!insideImage(ev.x, ev.y)) {
        st().setMessage({ kind: 'info', text: `Click on the photo to place the ${kind === 'divider' ? 'word divider' : 'lacuna'}.` });
        return;
      }
      at = { x: ev.x, y: ev.y };
      if (kind === 'divider') return place(undefined);
      st().setToolView({ guide: { kind: 'mark', mark: kind, x: ev.x, y: ev.y } });
      return machine.go('asking');
    },
    cancel: toIdle,
  };

  const asking: StateNode = {
    complete() {
      st().setMessage({ kind: 'info', text: 'Type about how many letters are lost (or leave it empty), then press Add lacuna.' });
    },
    cancel: toIdle,
  };

  const machine = new StateMachine<LetterState>('letter', store, { idle, pointing, boxing, placing, asking }, 'idle');

  return {
    name: 'letter',
    path: () => machine.path(),
    handle: (ev) => machine.handle(ev),
    cancel: () => machine.cancel(),
    startPlacing(k) {
      if (!st().project) return;
      // Whatever was under way gives way (its cancel restores what it changed).
      if (machine.state !== 'idle') machine.cancel();
      press = undefined;
      kind = k;
      void machine.go('placing');
    },
    submitLost(text) {
      if (machine.state !== 'asking' || kind !== 'lacuna' || !at) {
        st().setMessage({ kind: 'error', text: 'Click on the photo where the lacuna is first.' });
        return false;
      }
      const parsed = parseLost(text);
      if ('error' in parsed) {
        st().setMessage({ kind: 'error', text: parsed.error });
        return false;
      }
      place(parsed.lost);
      return true;
    },
    makeLetter() {
      if (machine.state !== 'idle') machine.cancel();
      return makeLetterOfPicked(store);
    },
    placing: () => (machine.state === 'placing' || machine.state === 'asking' ? kind : undefined),
  };
}
