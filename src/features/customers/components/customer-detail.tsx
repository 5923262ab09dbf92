import { useState } from 'react';
import type { CustomerDetail as Customer } from '../../../../shared/schemas/customers.schema';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { ApiError } from '../../../lib/api-client';
import { addContact, addItem, removeContact, updateContact, useCustomerChange } from '../api/customers';

const issueOf = (e: unknown, field: string) => (e instanceof ApiError ? e.issues.find((i) => i.path[1] === field)?.message : undefined);

/** One customer: contacts (who receives certificates) and items. */
export function CustomerDetail({ customer, canEdit }: { customer: Customer; canEdit: boolean }) {
  return (
    <div className="grid gap-6 xl:grid-cols-2">
      <Contacts customer={customer} canEdit={canEdit} />
      <Items customer={customer} canEdit={canEdit} />
    </div>
  );
}

function Contacts({ customer, canEdit }: { customer: Customer; canEdit: boolean }) {
  const add = useCustomerChange(addContact(customer.id));
  const remove = useCustomerChange(removeContact(customer.id));
  const [c, setC] = useState({ name: '', email: '', receivesCertificates: true });
  const toggle = useCustomerChange((x: { id: string; name: string; email: string; receivesCertificates: boolean }) =>
    updateContact(customer.id, x.id)({ name: x.name, email: x.email, receivesCertificates: x.receivesCertificates }),
  );
  return (
    <section aria-labelledby="contacts" className="space-y-3 rounded-card border border-line bg-surface p-4">
      <h2 id="contacts" className="text-lg font-semibold text-ink">Contacts</h2>
      {customer.contacts.length === 0 && <p className="text-sm text-ink-muted">No contacts yet: add the people who should receive issued certificates.</p>}
      <ul className="divide-y divide-line">
        {customer.contacts.map((p) => (
          <li key={p.id} className="flex flex-wrap items-center gap-3 py-2 text-sm">
            <span className="font-semibold">{p.name}</span>
            <span className="font-mono text-ink-muted">{p.email}</span>
            <span className="ml-auto">{p.receivesCertificates ? '✉ Receives certificates' : 'Does not receive certificates'}</span>
            {canEdit && (
              <>
                <Button variant="quiet" className="px-2 py-1" onClick={() => toggle.mutate({ ...p, receivesCertificates: !p.receivesCertificates })}>
                  {p.receivesCertificates ? 'Stop sending' : 'Send certificates'}<span className="sr-only"> to {p.name}</span>
                </Button>
                <Button variant="quiet" className="px-2 py-1" onClick={() => remove.mutate(p.id)}>
                  Remove<span className="sr-only"> {p.name}</span>
                </Button>
              </>
            )}
          </li>
        ))}
      </ul>
      {canEdit && (
        <form
          className="grid gap-3 md:grid-cols-2"
          onSubmit={async (e) => {
            e.preventDefault();
            try {
              await add.mutateAsync(c);
              setC({ name: '', email: '', receivesCertificates: true });
            } catch {
              /* shown below */
            }
          }}
        >
          <TextField label="Contact name" value={c.name} onChange={(e) => setC({ ...c, name: e.target.value })} error={issueOf(add.error, 'name')} />
          <TextField label="Contact e-mail" type="email" value={c.email} onChange={(e) => setC({ ...c, email: e.target.value })} error={issueOf(add.error, 'email')} />
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={c.receivesCertificates} onChange={(e) => setC({ ...c, receivesCertificates: e.target.checked })} />
            Receives issued certificates by e-mail
          </label>
          <Button type="submit" variant="secondary" disabled={add.isPending}>Add contact</Button>
        </form>
      )}
      {[add.error, remove.error, toggle.error].filter(Boolean).map((e, i) => (
        <Notice key={i} tone="danger" label="Not saved" role="alert">{(e as Error).message}</Notice>
      ))}
    </section>
  );
}

function Items({ customer, canEdit }: { customer: Customer; canEdit: boolean }) {
  const add = useCustomerChange(addItem(customer.id));
  const blank = { description: '', maker: '', model: '', serialNumber: '' };
  const [it, setIt] = useState(blank);
  return (
    <section aria-labelledby="items" className="space-y-3 rounded-card border border-line bg-surface p-4">
      <h2 id="items" className="text-lg font-semibold text-ink">Items for calibration</h2>
      {customer.items.length === 0 ? (
        <p className="text-sm text-ink-muted">No items yet.</p>
      ) : (
        <table className="w-full text-left text-sm">
          <thead className="text-xs text-ink-muted"><tr><th className="p-1">Description</th><th className="p-1">Maker</th><th className="p-1">Model</th><th className="p-1">Serial</th></tr></thead>
          <tbody>
            {customer.items.map((i) => (
              <tr key={i.id} className="border-t border-line"><td className="p-1">{i.description}</td><td className="p-1">{i.maker}</td><td className="p-1">{i.model}</td><td className="p-1 font-mono">{i.serialNumber}</td></tr>
            ))}
          </tbody>
        </table>
      )}
      {canEdit && (
        <form
          className="grid gap-3 md:grid-cols-2"
          onSubmit={async (e) => {
            e.preventDefault();
            try {
              await add.mutateAsync(it);
              setIt(blank);
            } catch {
              /* shown below */
            }
          }}
        >
          <TextField label="Description" value={it.description} onChange={(e) => setIt({ ...it, description: e.target.value })} error={issueOf(add.error, 'description')} />
          <TextField label="Serial number" value={it.serialNumber} onChange={(e) => setIt({ ...it, serialNumber: e.target.value })} error={issueOf(add.error, 'serialNumber')} />
          <TextField label="Maker" value={it.maker} onChange={(e) => setIt({ ...it, maker: e.target.value })} />
          <TextField label="Model" value={it.model} onChange={(e) => setIt({ ...it, model: e.target.value })} />
          <Button type="submit" variant="secondary" disabled={add.isPending}>Add item</Button>
        </form>
      )}
      {add.error && <Notice tone="danger" label="Item not added" role="alert">{add.error.message}</Notice>}
    </section>
  );
}
