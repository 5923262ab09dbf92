import { useState } from 'react';
import { ROLE_LABELS, ROLES, type Role } from '../../../../shared/schemas/roles';
import type { UserSummary } from '../../../../shared/schemas/users.schema';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { ApiError } from '../../../lib/api-client';
import { useInviteUser, useUpdateUser, useUserAction, useUsers } from '../api/users';

const selectClass = 'rounded-field border border-line-strong bg-surface px-3 py-2 text-sm';
type Customers = Array<{ id: string; organisation: string }>;

/** Users and roles: invite, change role, deactivate or reactivate, send a new password link. */
export function UserAdmin({ customers, meId }: { customers: Customers; meId: string }) {
  const q = useUsers();
  const action = useUserAction();
  const update = useUpdateUser();
  const [confirm, setConfirm] = useState<{ user: UserSummary; action: 'deactivate' | 'reset-password' } | null>(null);
  const error = action.error ?? update.error;
  return (
    <div className="space-y-6">
      <InviteForm customers={customers} />
      {error && <Notice tone="danger" label="Not changed" role="alert">{error.message}</Notice>}
      {action.isSuccess && !error && <Notice tone="ok" label="Done" role="status">The change is saved and in the audit log.</Notice>}
      {confirm && (
        <div role="alertdialog" aria-labelledby="confirm-title" className="rounded-card border-2 border-warn bg-warn-soft p-4">
          <p id="confirm-title" className="font-semibold">
            {confirm.action === 'deactivate'
              ? `Deactivate ${confirm.user.name}? They are signed out at once and cannot sign in until reactivated.`
              : `Reset the password of ${confirm.user.name}? The current password stops working, they are signed out, and a new link is e-mailed to ${confirm.user.email}.`}
          </p>
          <div className="mt-3 flex gap-3">
            <Button onClick={() => { action.mutate({ id: confirm.user.id, action: confirm.action }); setConfirm(null); }}>
              {confirm.action === 'deactivate' ? 'Deactivate' : 'Reset password'}
            </Button>
            <Button variant="secondary" onClick={() => setConfirm(null)}>Cancel</Button>
          </div>
        </div>
      )}
      {q.isPending && <p role="status" className="text-sm text-ink-muted">Loading users…</p>}
      {q.error && <Notice tone="danger" label="Users could not be loaded" role="alert">{q.error.message}</Notice>}
      {q.data && (
        <div className="overflow-x-auto rounded-card border border-line bg-surface">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-line bg-sunken text-xs text-ink-muted">
              <tr><th className="px-3 py-2">Name</th><th className="px-3 py-2">E-mail</th><th className="px-3 py-2">Role</th><th className="px-3 py-2">Status</th><th className="px-3 py-2">Actions</th></tr>
            </thead>
            <tbody>
              {q.data.map((u) => (
                <tr key={u.id} className="border-b border-line last:border-0">
                  <td className="px-3 py-2 font-semibold">{u.name}{u.id === meId && <span className="font-normal text-ink-muted"> (you)</span>}</td>
                  <td className="px-3 py-2 font-mono">{u.email}</td>
                  <td className="px-3 py-2">
                    <select
                      aria-label={`Role of ${u.name}`}
                      className={selectClass}
                      value={u.role ?? ''}
                      disabled={u.role === 'customer' || update.isPending}
                      onChange={(e) => update.mutate({ id: u.id, name: u.name, role: e.target.value as Role })}
                    >
                      {u.role === null && <option value="">No role</option>}
                      {ROLES.filter((r) => r !== 'customer' || u.role === 'customer').map((r) => (
                        <option key={r} value={r}>{ROLE_LABELS[r]}</option>
                      ))}
                    </select>
                    {u.customerName && <span className="block text-xs text-ink-muted">{u.customerName}</span>}
                  </td>
                  <td className="px-3 py-2">
                    {u.active ? <span>● Active</span> : <span className="font-semibold text-danger">■ Deactivated</span>}
                    {u.invitationPending && <span className="block text-xs text-ink-muted">✉ Link sent, not used yet</span>}
                  </td>
                  <td className="space-x-1 px-3 py-2 whitespace-nowrap">
                    {u.active ? (
                      <>
                        <Button variant="quiet" className="px-2 py-1" onClick={() => setConfirm({ user: u, action: 'reset-password' })}>Reset password<span className="sr-only"> of {u.name}</span></Button>
                        <Button variant="quiet" className="px-2 py-1" onClick={() => setConfirm({ user: u, action: 'deactivate' })}>Deactivate<span className="sr-only"> {u.name}</span></Button>
                      </>
                    ) : (
                      <Button variant="quiet" className="px-2 py-1" onClick={() => action.mutate({ id: u.id, action: 'reactivate' })}>Reactivate<span className="sr-only"> {u.name}</span></Button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

function InviteForm({ customers }: { customers: Customers }) {
  const invite = useInviteUser();
  const blank = { name: '', email: '', role: 'analyst' as Role, customerId: '' };
  const [f, setF] = useState(blank);
  const issue = (k: string) => (invite.error instanceof ApiError ? invite.error.issues.find((i) => i.path[1] === k)?.message : undefined);
  return (
    <form
      className="grid gap-3 rounded-card border border-line bg-surface p-4 md:grid-cols-4 md:items-end"
      onSubmit={async (e) => {
        e.preventDefault();
        try {
          await invite.mutateAsync({ name: f.name, email: f.email, role: f.role, customerId: f.role === 'customer' ? f.customerId || null : null });
          setF(blank);
        } catch {
          /* shown below */
        }
      }}
    >
      <p className="text-sm font-semibold text-ink md:col-span-4">Invite a person: they get an e-mail with a one-time link to choose their password.</p>
      <TextField label="Name" value={f.name} onChange={(e) => setF({ ...f, name: e.target.value })} error={issue('name')} />
      <TextField label="E-mail" type="email" value={f.email} onChange={(e) => setF({ ...f, email: e.target.value })} error={issue('email')} />
      <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
        Role
        <select className={selectClass} value={f.role} onChange={(e) => setF({ ...f, role: e.target.value as Role })}>
          {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
        </select>
      </label>
      {f.role === 'customer' ? (
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink">
          Organisation
          <select className={selectClass} value={f.customerId} onChange={(e) => setF({ ...f, customerId: e.target.value })}>
            <option value="">Choose…</option>
            {customers.map((c) => <option key={c.id} value={c.id}>{c.organisation}</option>)}
          </select>
          {issue('customerId') && <span className="text-sm font-medium text-danger">✕ {issue('customerId')}</span>}
        </label>
      ) : (
        <span />
      )}
      <Button type="submit" disabled={invite.isPending} className="md:col-start-4">{invite.isPending ? 'Sending…' : 'Send invitation'}</Button>
      {invite.error && <Notice tone="danger" label="Not invited" role="alert" className="md:col-span-4">{invite.error.message}</Notice>}
      {invite.isSuccess && <Notice tone="ok" label="Invitation queued" role="status" className="md:col-span-4">The e-mail is in the outbox; the link is valid for 72 hours.</Notice>}
    </form>
  );
}
