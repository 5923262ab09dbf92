import { useEffect, useRef } from 'react';
import { Button } from '../../../components/ui/button';

/** Asks before releasing: says what will be frozen and what happens next. */
export function ReleaseDialog({ open, name, version, busy, onConfirm, onCancel }: { open: boolean; name: string; version: number; busy: boolean; onConfirm: () => void; onCancel: () => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    // happy-dom and older engines may lack showModal/close: fall back to the open attribute.
    if (open && !d.open) {
      if (typeof d.showModal === 'function') d.showModal();
      else d.setAttribute('open', '');
    }
    if (!open && d.open) {
      if (typeof d.close === 'function') d.close();
      else d.removeAttribute('open');
    }
  }, [open]);
  return (
    <dialog ref={ref} aria-labelledby="release-title" onCancel={onCancel} className="m-auto max-w-lg rounded-card border border-line bg-surface p-6 text-ink shadow-card backdrop:bg-ink/40">
      <h2 id="release-title" className="text-lg font-semibold">Release version {version} of “{name}”?</h2>
      <div className="mt-3 space-y-2 text-sm">
        <p>The validation runs again first. If every check passes, this version is frozen: its measurand, equations, input quantities and their default distributions, CMC rows, decision rule, certificate wording and reference case can no longer be changed, and the validation record is kept with it.</p>
        <p>Analysts can then use it for new calibration jobs. To change the model later, make a new version from it.</p>
      </div>
      <div className="mt-5 flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel} disabled={busy}>Keep as draft</Button>
        <Button onClick={onConfirm} disabled={busy}>{busy ? 'Releasing…' : 'Release and freeze'}</Button>
      </div>
    </dialog>
  );
}
