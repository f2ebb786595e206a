/** Small helpers for the panels' one-line fields that commit when they are left. */
import type { KeyboardEvent } from 'react';

/** Enter commits a one-line field (by leaving it); Esc puts back what it held. */
export function commitKeys(original: string) {
  return (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === 'Enter') {
      e.preventDefault();
      e.currentTarget.blur();
    } else if (e.key === 'Escape') {
      e.preventDefault();
      e.currentTarget.value = original;
      e.currentTarget.blur();
    }
  };
}
