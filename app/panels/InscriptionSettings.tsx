/**
 * The inscription's settings: the project's title, the script (the label palette), the
 * reading direction (which re-orders the letters of every line), and the description and
 * creator the exports write into their metadata. Every edit is one undo step: text fields
 * commit on Enter or when they lose the focus, the selects at once.
 */
import { commitKeys } from './fields.ts';
import { setInscription, setTitle } from '../../src/doc/rules.ts';
import { SCRIPTS } from '../../src/export/scripts.ts';
import type { Inscription } from '../../src/doc/model.ts';
import { editorStore, useEditor } from '../store/useEditor.ts';

function changeInscription(patch: Partial<Inscription>): void {
  const p = editorStore.getState().project;
  if (!p) return;
  const key = Object.keys(patch) as (keyof Inscription)[];
  if (key.every((k) => p.inscription[k] === patch[k])) return;
  editorStore.getState().change((q) => setInscription(q, patch));
}

export function InscriptionSettings() {
  const title = useEditor((s) => s.project?.title);
  const inscription = useEditor((s) => s.project?.inscription);
  if (title === undefined || !inscription) return null;
  const known = SCRIPTS.some((s) => s.id === inscription.script);
  return (
    <section className="inscription-settings" aria-labelledby="inscription-heading">
      <h3 id="inscription-heading">Inscription</h3>
      <div className="inscription-fields">
        <label>
          Title
          <input
            key={`title:${title}`} type="text" defaultValue={title} onKeyDown={commitKeys(title)}
            onBlur={(e) => {
              const v = e.currentTarget.value.trim();
              if (!v) {
                e.currentTarget.value = title;
                editorStore.getState().setMessage({ kind: 'error', text: 'A project needs a title; the old one is kept.' });
              } else if (v !== title) editorStore.getState().change((p) => setTitle(p, v));
            }}
          />
        </label>
        <label>
          Script
          <select value={inscription.script} onChange={(e) => changeInscription({ script: e.currentTarget.value })}>
            {!known && <option value={inscription.script}>{inscription.script}</option>}
            {SCRIPTS.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
          </select>
        </label>
        <label>
          Reading direction
          <select value={inscription.direction} onChange={(e) => changeInscription({ direction: e.currentTarget.value as Inscription['direction'] })}>
            <option value="rtl">right to left</option>
            <option value="ltr">left to right</option>
          </select>
        </label>
        <label>
          Description
          <textarea
            key={`description:${inscription.description}`} rows={2} defaultValue={inscription.description}
            onBlur={(e) => changeInscription({ description: e.currentTarget.value })}
          />
        </label>
        <label>
          Creator
          <input
            key={`creator:${inscription.creator}`} type="text" defaultValue={inscription.creator}
            placeholder="who made the facsimile" onKeyDown={commitKeys(inscription.creator)}
            onBlur={(e) => changeInscription({ creator: e.currentTarget.value.trim() })}
          />
        </label>
      </div>
    </section>
  );
}
