/**
 * The Letters list (left column, under the Strokes): the actions of the Letter tool, the
 * selected letter's fields (label with the script's palette, doubtful, restored, line),
 * the transcription line by line with the Leiden marks, the letters and text marks in
 * reading order, and the inscription's settings. Every edit is one undo step.
 */
import { useEffect, useRef, useState } from 'react';
import { commitKeys } from './fields.ts';
import { letterBox } from '../../src/doc/layout.ts';
import type { Letter, Project, TextMark } from '../../src/doc/model.ts';
import { deleteLetters, deleteTextMarks, updateLetter, updateTextMark } from '../../src/doc/rules.ts';
import { scriptPalette } from '../../src/export/scripts.ts';
import { lacunaText, readingText, transcription } from '../../src/export/transcription.ts';
import { activeTool, switchTool } from '../canvas/tools.ts';
import { currentSurface } from '../canvas/view.ts';
import type { LetterTool } from '../tools/letter/letterTool.ts';
import { parseLost } from '../tools/letter/letterTool.ts';
import { makeLetterOfPicked } from '../tools/letter/pick.ts';
import { editorStore, useEditor } from '../store/useEditor.ts';
import { formatLength } from './format.ts';
import { InscriptionSettings } from './InscriptionSettings.tsx';
import './letters.css';

/** Characters shown in the palette before "More characters" (Latin has over a thousand). */
const PALETTE_FIRST = 60;

const change = (fn: (p: Project) => Project) => editorStore.getState().change(fn);
const say = (text: string) => editorStore.getState().setMessage({ kind: 'error', text });

/** The Letter tool, made active first if need be. */
function letterTool(): LetterTool | undefined {
  switchTool(editorStore, 'letter');
  const t = activeTool();
  return t?.name === 'letter' ? (t as LetterTool) : undefined;
}

function codePoint(ch: string): string {
  return `U+${ch.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;
}

function Palette({ script, onPick }: { script: string; onPick(ch: string): void }) {
  const [all, setAll] = useState(false);
  const chars = scriptPalette(script);
  if (chars.length === 0) return <p className="panel-empty">No palette for the script {script}.</p>;
  const shown = all ? chars : chars.slice(0, PALETTE_FIRST);
  return (
    <div className="palette" role="group" aria-label={`Palette of the script ${script}`}>
      {shown.map((ch) => (
        <button key={ch} type="button" className="palette-char" title={codePoint(ch)} aria-label={`Label ${ch} (${codePoint(ch)})`} onClick={() => onPick(ch)}>
          {ch}
        </button>
      ))}
      {chars.length > PALETTE_FIRST && (
        <button type="button" className="palette-more" onClick={() => setAll(!all)}>
          {all ? 'Fewer characters' : `More characters (${chars.length - PALETTE_FIRST})`}
        </button>
      )}
    </div>
  );
}

function LetterFields({ letter, project }: { letter: Letter; project: Project }) {
  const surface = project.surfaces.find((s) => s.id === letter.surfaceId);
  const box = letterBox(project, letter);
  // What is typed in the Label field and not committed yet: kept when the selection moves
  // to another letter (the field is replaced without a blur), so no typing is lost.
  const typed = useRef<{ id: string; value: string } | undefined>(undefined);
  useEffect(() => {
    const id = letter.id;
    return () => {
      const t = typed.current;
      typed.current = undefined;
      const now = editorStore.getState().project?.letters[id];
      if (t && t.id === id && now && t.value !== now.label) change((p) => (p.letters[id] ? updateLetter(p, id, { label: t.value }) : p));
    };
  }, [letter.id]);
  const commitLabel = (v: string) => {
    typed.current = undefined;
    if (v !== letter.label) change((p) => updateLetter(p, letter.id, { label: v }));
  };
  const commitLine = (input: HTMLInputElement) => {
    const v = input.value.trim();
    const n = Number(v);
    if (!(Number.isInteger(n) && n >= 1)) {
      input.value = String(letter.line);
      say(`The line must be a whole number from 1, not "${v}".`);
      return;
    }
    if (n !== letter.line || !letter.lineByHand) change((p) => updateLetter(p, letter.id, { line: n }));
  };
  return (
    <div className="letter-fields" aria-label="Selected letter" role="group">
      <p className="selection-title">
        Letter {letter.line}.{letter.order}: <span className="letter-reading">{readingText(letter)}</span>
      </p>
      {box && surface && (
        <p className="letter-size">
          {formatLength(box[2] - box[0], surface.pxPerMm)} × {formatLength(box[3] - box[1], surface.pxPerMm)}, {letter.strokeIds.length} stroke{letter.strokeIds.length === 1 ? '' : 's'}
        </p>
      )}
      <label className="letter-field">
        Label
        <input
          key={`${letter.id}:${letter.label}`} type="text" defaultValue={letter.label} autoComplete="off"
          onChange={(e) => { typed.current = { id: letter.id, value: e.currentTarget.value }; }}
          onKeyDown={commitKeys(letter.label)} onBlur={(e) => commitLabel(e.currentTarget.value)}
        />
      </label>
      <Palette script={project.inscription.script} onPick={commitLabel} />
      <label className="panel-toggle">
        <input
          type="checkbox" checked={letter.reading === 'doubtful'}
          onChange={(e) => change((p) => updateLetter(p, letter.id, { reading: e.currentTarget.checked ? 'doubtful' : 'clear' }))}
        />
        Doubtful
      </label>
      <label className="panel-toggle" title="The letter is supplied by the editor, not read on the surface">
        <input type="checkbox" checked={letter.restored} onChange={(e) => change((p) => updateLetter(p, letter.id, { restored: e.currentTarget.checked }))} />
        Restored
      </label>
      <label className="letter-field">
        Line
        <input
          key={`${letter.id}:${letter.line}`} type="number" min={1} step={1} defaultValue={letter.line}
          onKeyDown={commitKeys(String(letter.line))} onBlur={(e) => commitLine(e.currentTarget)}
        />
        {letter.lineByHand && (
          <button type="button" title="Let the layout place it again" onClick={() => change((p) => updateLetter(p, letter.id, { lineByHand: false }))}>
            Automatic
          </button>
        )}
      </label>
      <button type="button" onClick={() => change((p) => deleteLetters(p, [letter.id]))}>Delete letter</button>
    </div>
  );
}

function MarkFields({ mark }: { mark: TextMark }) {
  const name = mark.kind === 'divider' ? 'Word divider' : 'Lacuna';
  return (
    <div className="letter-fields" role="group" aria-label={`Selected ${name.toLowerCase()}`}>
      <p className="selection-title">{name} {mark.line}.{mark.order}</p>
      {mark.kind === 'lacuna' && (
        <label className="letter-field">
          Lost letters (about)
          <input
            key={`${mark.id}:${mark.lost ?? ''}`} type="text" defaultValue={mark.lost ?? ''} placeholder="unknown"
            onKeyDown={commitKeys(String(mark.lost ?? ''))}
            onBlur={(e) => {
              const parsed = parseLost(e.currentTarget.value);
              if ('error' in parsed) {
                e.currentTarget.value = String(mark.lost ?? '');
                say(parsed.error);
              } else if (parsed.lost !== mark.lost) change((p) => updateTextMark(p, mark.id, { lost: parsed.lost }));
            }}
          />
        </label>
      )}
      <button type="button" onClick={() => change((p) => deleteTextMarks(p, [mark.id]))}>Delete {name.toLowerCase()}</button>
    </div>
  );
}

type Row = { kind: 'letter'; letter: Letter } | { kind: 'mark'; mark: TextMark };

function rowsOf(p: Project, surfaceId: string): Row[] {
  const rows: Row[] = [];
  for (const letter of Object.values(p.letters)) if (letter.surfaceId === surfaceId) rows.push({ kind: 'letter', letter });
  for (const mark of Object.values(p.textMarks)) if (mark.surfaceId === surfaceId) rows.push({ kind: 'mark', mark });
  const place = (r: Row) => (r.kind === 'letter' ? r.letter : r.mark);
  return rows.sort((a, b) => place(a).line - place(b).line || place(a).order - place(b).order);
}

export function LettersPanel() {
  const project = useEditor((s) => s.project);
  const picked = useEditor((s) => s.selection.length);
  const letterSelection = useEditor((s) => s.letterSelection);
  const surface = currentSurface(project);
  if (!project || !surface) {
    return (
      <section aria-labelledby="letters-heading">
        <div className="panel-head"><h2 id="letters-heading">Letters</h2></div>
        <p className="panel-empty">No project open.</p>
      </section>
    );
  }
  const selected = new Set(letterSelection);
  const one = letterSelection.length === 1 ? letterSelection[0] : undefined;
  const rows = rowsOf(project, surface.id);
  const lines = transcription(project, surface.id);
  const dir = project.inscription.direction;
  const select = (id: string, shift: boolean) => {
    const s = editorStore.getState();
    s.select([]);
    s.selectLetters([id], shift ? 'toggle' : 'replace');
  };

  return (
    <section aria-labelledby="letters-heading" className="letters-panel">
      <div className="panel-head">
        <h2 id="letters-heading">Letters</h2>
      </div>
      <div className="letter-actions">
        <button
          type="button" disabled={picked === 0} title="Make the picked strokes one letter (Enter in the Letter tool)"
          onClick={() => {
            switchTool(editorStore, 'letter');
            makeLetterOfPicked(editorStore);
          }}
        >
          Make letter
        </button>
        <button type="button" onClick={() => letterTool()?.startPlacing('divider')}>Add word divider</button>
        <button type="button" onClick={() => letterTool()?.startPlacing('lacuna')}>Add lacuna</button>
      </div>
      {one && project.letters[one] && <LetterFields letter={project.letters[one]} project={project} />}
      {one && project.textMarks[one] && <MarkFields mark={project.textMarks[one]} />}
      {letterSelection.length > 1 && (
        <p className="selection-title">
          {letterSelection.length} selected{' '}
          <button type="button" onClick={() => editorStore.getState().deleteLetterSelection()}>Delete them</button>
        </p>
      )}
      <h3 id="transcription-heading">Transcription</h3>
      <p className="letters-note">A transcription is a reading: doubtful letters carry a dot below, restored ones stand in brackets.</p>
      {lines.length === 0 ? (
        <p className="panel-empty">No letters yet: pick strokes with the Letter tool (L) and press Enter.</p>
      ) : (
        <ol className="transcription" aria-labelledby="transcription-heading">
          {lines.map((l) => (
            <li key={l.line} className="transcription-line">
              <span className="line-number">{l.line}</span>
              <span className="line-text" dir={dir}>{l.text}</span>
            </li>
          ))}
        </ol>
      )}
      {rows.length > 0 && (
        <ol className="letter-list" aria-label="Letters and marks in reading order">
          {rows.map((r) => {
            const item = r.kind === 'letter' ? r.letter : r.mark;
            const text = r.kind === 'letter' ? readingText(r.letter) : r.mark.kind === 'divider' ? 'word divider' : `lacuna ${lacunaText(r.mark.lost)}`;
            const reading = r.kind === 'letter' ? `${r.letter.reading}${r.letter.restored ? ', restored' : ''}` : '';
            return (
              <li key={item.id} className={selected.has(item.id) ? 'letter-row selected' : 'letter-row'} data-letter-id={item.id}>
                <button type="button" className="letter-pick" aria-pressed={selected.has(item.id)} onClick={(e) => select(item.id, e.shiftKey)}>
                  <span className="letter-place">{item.line}.{item.order}</span>
                  <span className="letter-label">{text}</span>
                  <span className={`letter-state ${r.kind === 'letter' ? r.letter.reading : ''}`}>{reading}</span>
                </button>
              </li>
            );
          })}
        </ol>
      )}
      <InscriptionSettings />
    </section>
  );
}
