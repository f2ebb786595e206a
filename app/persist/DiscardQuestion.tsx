/**
 * The question asked before something would replace a project with unsaved changes
 * (opening a file, a dropped file, the finished example). Keeping the work is the safe
 * answer, so it has the focus; Esc keeps it too.
 */
import { createPortal } from 'react-dom';
import './persist.css';

export interface DiscardQuestionProps {
  /** The open project's title. */
  title: string | undefined;
  /** What would replace it, as a phrase: "opening sherd.png". */
  action: string;
  /** The label of the button that goes ahead. */
  goLabel: string;
  onKeep(): void;
  onGo(): void;
}

export function DiscardQuestion({ title, action, goLabel, onKeep, onGo }: DiscardQuestionProps) {
  // On the page's body: the top bar's styles (dark buttons, no wrapping) are not the question's.
  return createPortal(
    <div
      className="restore-backdrop"
      onKeyDown={(e) => {
        e.stopPropagation();
        if (e.key === 'Escape') onKeep();
      }}
    >
      <div className="restore-offer" role="dialog" aria-modal="true" aria-labelledby="discard-question">
        <p id="discard-question">
          <strong>{title || 'untitled'}</strong> has unsaved changes, which {action} would lose (Save keeps them in
          a file). Go ahead anyway?
        </p>
        <div className="restore-buttons">
          <button type="button" autoFocus onClick={onKeep}>Keep my work</button>
          <button type="button" onClick={onGo}>{goLabel}</button>
        </div>
      </div>
    </div>,
    document.body,
  );
}
