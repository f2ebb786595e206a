/** The question startup asks when the browser kept unsaved work: restore it or discard it. */
import { useStore } from 'zustand';
import { restoreOfferStore } from './startup.ts';
import './persist.css';

export function RestoreOffer() {
  const offer = useStore(restoreOfferStore, (s) => s.offer);
  if (!offer) return null;
  const when = new Date(offer.changedAt).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
  return (
    <div className="restore-backdrop">
      <div className="restore-offer" role="dialog" aria-modal="true" aria-labelledby="restore-offer-question">
        <p id="restore-offer-question">
          Restore the unsaved work of <strong>{offer.title || 'untitled'}</strong> from {when}?
        </p>
        <div className="restore-buttons">
          {/* Restore is the safe answer, so it takes the focus: Enter keeps the work. */}
          <button type="button" autoFocus onClick={offer.restore}>Restore</button>
          <button type="button" onClick={offer.discard}>Discard</button>
        </div>
      </div>
    </div>
  );
}
