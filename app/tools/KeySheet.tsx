/** The key sheet (`?`): every key of the editor, read from the same table as handleKey. */
import type { CSSProperties, KeyboardEvent } from 'react';
import { KEY_BINDINGS, keyLabel } from './keys.ts';

const backdrop: CSSProperties = {
  position: 'fixed', inset: 0, background: 'rgba(0, 0, 0, 0.35)', display: 'flex', alignItems: 'center', justifyContent: 'center', zIndex: 10,
};
const panel: CSSProperties = {
  background: '#fff', color: '#1b1b1f', borderRadius: 6, padding: '16px 20px', maxWidth: 560, boxShadow: '0 4px 24px rgba(0, 0, 0, 0.25)',
};
const kbd: CSSProperties = { fontFamily: 'inherit', fontWeight: 600, whiteSpace: 'nowrap', paddingRight: 16, textAlign: 'left', verticalAlign: 'top' };

export interface KeySheetProps {
  open: boolean;
  onClose(): void;
}

export function KeySheet({ open, onClose }: KeySheetProps) {
  if (!open) return null;
  const onKeyDown = (e: KeyboardEvent) => {
    // Esc and `?` close the sheet and go no further, so the active tool keeps its gesture.
    if (e.key === 'Escape' || e.key === '?') {
      e.stopPropagation();
      e.preventDefault();
      onClose();
    }
  };
  return (
    <div style={backdrop} onClick={onClose} onKeyDown={onKeyDown}>
      <div role="dialog" aria-modal="true" aria-labelledby="key-sheet-title" style={panel} onClick={(e) => e.stopPropagation()}>
        <h2 id="key-sheet-title" style={{ marginTop: 0, fontSize: '1.1em' }}>Keys</h2>
        <table>
          <tbody>
            {KEY_BINDINGS.map((b) => (
              <tr key={keyLabel(b)}>
                <th scope="row" style={kbd}><kbd>{keyLabel(b)}</kbd></th>
                <td>{b.does}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p style={{ textAlign: 'right', marginBottom: 0 }}>
          <button type="button" autoFocus onClick={onClose}>Close</button>
        </p>
      </div>
    </div>
  );
}
