import { useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { createCustomer, useCustomerChange, useCustomers } from '../api/customers';

/** Customer organisations with how many contacts and items each has; managers can add one. */
export function CustomerList({ canEdit }: { canEdit: boolean }) {
  const q = useCustomers();
  const navigate = useNavigate();
  const [org, setOrg] = useState('');
  const [address, setAddress] = useState('');
  const create = useCustomerChange(createCustomer);
  return (
    <div className="space-y-6">
      {q.isPending && <p role="status" className="text-sm text-ink-muted">Loading customers…</p>}
      {q.error && <Notice tone="danger" label="Customers could not be loaded" role="alert">{q.error.message}</Notice>}
      {q.data && (
        <ul className="divide-y divide-line rounded-card border border-line bg-surface">
          {q.data.map((c) => (
            <li key={c.id} className="flex flex-wrap items-baseline justify-between gap-2 px-4 py-3">
              <Link to={`/app/customers/${c.id}`} className="font-semibold text-ember underline-offset-2 hover:underline">{c.organisation}</Link>
              <span className="text-sm text-ink-muted">
                {c.contactCount} {c.contactCount === 1 ? 'contact' : 'contacts'} · {c.itemCount} {c.itemCount === 1 ? 'item' : 'items'}
              </span>
            </li>
          ))}
        </ul>
      )}
      {canEdit && (
        <form
          className="grid gap-3 rounded-card border border-line bg-surface p-4 md:grid-cols-[1fr_1fr_auto] md:items-end"
          onSubmit={async (e) => {
            e.preventDefault();
            try {
              const res = (await create.mutateAsync({ organisation: org, address })) as { customer: { id: string } };
              navigate(`/app/customers/${res.customer.id}`);
            } catch {
              /* shown below */
            }
          }}
        >
          <TextField label="New customer organisation" value={org} onChange={(e) => setOrg(e.target.value)} />
          <TextField label="Address" value={address} onChange={(e) => setAddress(e.target.value)} />
          <Button type="submit" disabled={create.isPending}>Add customer</Button>
          {create.error && <Notice tone="danger" label="Not added" role="alert" className="md:col-span-3">{create.error.message}</Notice>}
        </form>
      )}
    </div>
  );
}
