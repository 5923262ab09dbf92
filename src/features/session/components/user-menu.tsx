import { useEffect, useId, useRef, useState } from 'react';
import type { SessionUser } from '../../../../shared/schemas/me.schema';
import { ROLE_LABELS } from '../../../../shared/schemas/roles';

/**
 * The signed-in person, their role and "Sign out", as a disclosure button: Enter/Space opens it,
 * Escape closes it and returns focus, clicking elsewhere closes it.
 */
export function UserMenu({ user, onSignOut }: { user: SessionUser; onSignOut: () => void }) {
  const [open, setOpen] = useState(false);
  const panelId = useId();
  const buttonRef = useRef<HTMLButtonElement>(null);
  const rootRef = useRef<HTMLDivElement>(null);
  const roleLabel = user.role ? ROLE_LABELS[user.role] : 'No role';

  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === 'Escape') {
        setOpen(false);
        buttonRef.current?.focus();
      }
    };
    const onClick = (e: MouseEvent) => {
      if (rootRef.current && !rootRef.current.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('keydown', onKey);
    document.addEventListener('mousedown', onClick);
    return () => {
      document.removeEventListener('keydown', onKey);
      document.removeEventListener('mousedown', onClick);
    };
  }, [open]);

  return (
    <div ref={rootRef} className="relative">
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen((o) => !o)}
        className="flex items-center gap-2 rounded-field px-3 py-1.5 text-left text-sm hover:bg-sunken"
      >
        <span className="flex flex-col leading-tight">
          <span className="font-semibold text-ink">{user.name}</span>
          <span className="text-xs text-ink-muted">{roleLabel}</span>
        </span>
        <span aria-hidden="true" className="text-ink-muted">▾</span>
        <span className="sr-only">Account menu</span>
      </button>
      {open && (
        <div id={panelId} className="absolute right-0 z-20 mt-1 w-64 rounded-card border border-line bg-surface p-3 shadow-card">
          <p className="text-sm font-semibold">{user.name}</p>
          <p className="text-xs break-all text-ink-muted">{user.email}</p>
          <p className="mt-1 text-xs text-ink-muted">Role: {roleLabel}</p>
          <button
            type="button"
            onClick={onSignOut}
            className="mt-3 w-full rounded-field border border-line-strong px-3 py-1.5 text-sm font-semibold hover:bg-sunken"
          >
            Sign out
          </button>
        </div>
      )}
    </div>
  );
}
