/*
 * Customers, their contacts (who receives certificates, ISO/IEC 17025:2017 §7.8.1) and their
 * items (identification of the item calibrated, §7.8.2.1 e)). Quality managers and admins manage;
 * analysts read and pick.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { customerDetailSchema, customerListSchema, itemListSchema } from '../../shared/schemas/customers.schema';
import { createTestApp, type TestApp } from '../setup/test-app';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;
const UNKNOWN = '00000000-0000-4000-8000-000000000000';

describe('/api/customers and /api/items', () => {
  let t: TestApp;
  let qm: Agent;
  let analyst: Agent;
  let customerId: string;
  beforeAll(async () => {
    t = await createTestApp();
    qm = await t.signIn('quality_manager');
    analyst = await t.signIn('analyst');
  });
  afterAll(() => t?.close());

  it('when the analyst lists customers and items, then the demo organisations come with their instruments', async () => {
    const { customers } = customerListSchema.parse((await analyst.get('/api/customers').expect(200)).body);
    expect(customers).toHaveLength(3);
    expect(customers.reduce((n, c) => n + c.itemCount, 0)).toBe(6);
    const { items } = itemListSchema.parse((await analyst.get('/api/items').expect(200)).body);
    expect(items.map((i) => i.description)).toEqual(expect.arrayContaining(['Handheld infrared thermometer', 'Thermal imager', 'Portable blackbody source']));
    const imager = items.find((i) => i.description === 'Thermal imager')!;
    expect(imager.label).toBe('Thermal imager, Orrin Optics (demo) VistaTherm 320, s/n VT320-7731');
    const search = itemListSchema.parse((await analyst.get('/api/items?q=qs5').expect(200)).body);
    expect(search.items).toHaveLength(2);
    const byCustomer = itemListSchema.parse((await analyst.get(`/api/items?customerId=${imager.customerId}`).expect(200)).body);
    expect(byCustomer.items.every((i) => i.customerId === imager.customerId)).toBe(true);
    await analyst.get(`/api/items/${imager.id}`).expect(200);
    await analyst.get(`/api/items/${UNKNOWN}`).expect(404);
    await analyst.get('/api/items?customerId=nope').expect(400);
  });

  it('when a quality manager creates a customer, then it is stored and audited; a duplicate name is 409', async () => {
    const res = await qm.post('/api/customers').send({ organisation: 'Ridgeway Kilns (demo)', address: '5 Clay Lane' }).expect(201);
    const c = customerDetailSchema.parse(res.body.customer);
    customerId = c.id;
    expect(c).toMatchObject({ contacts: [], items: [] });
    await qm.post('/api/customers').send({ organisation: 'ridgeway kilns (DEMO)' }).expect(409);
    const bad = await qm.post('/api/customers').send({ organisation: '  ' }).expect(400);
    expect(bad.body.error.issues[0]).toMatchObject({ path: ['body', 'organisation'], message: 'Enter the organisation name.' });
    const [row] = await t.database.query<{ action: string; actor_role: string }>(`select * from audit_log where entity = 'customer' and entity_id = $1`, [c.id]);
    expect(row).toMatchObject({ action: 'create', actor_role: 'quality_manager' });
  });

  it('when the customer is updated, then 200; unknown id 404; bad id 400', async () => {
    await qm.put(`/api/customers/${customerId}`).send({ organisation: 'Ridgeway Kilns Ltd (demo)', address: '5 Clay Lane' }).expect(200);
    await qm.put(`/api/customers/${UNKNOWN}`).send({ organisation: 'Nobody' }).expect(404);
    await analyst.get(`/api/customers/${UNKNOWN}`).expect(404);
    await analyst.get('/api/customers/xyz').expect(400);
  });

  it('contacts: add, change who receives certificates, refuse duplicates, remove', async () => {
    const add = await qm.post(`/api/customers/${customerId}/contacts`).send({ name: 'Hana Ashdown', email: 'H.Ashdown@ridgeway-kilns.example.com' }).expect(201);
    expect(add.body.contact).toMatchObject({ email: 'h.ashdown@ridgeway-kilns.example.com', receivesCertificates: true });
    await qm.post(`/api/customers/${customerId}/contacts`).send({ name: 'Again', email: 'h.ashdown@ridgeway-kilns.example.com' }).expect(409);
    const bad = await qm.post(`/api/customers/${customerId}/contacts`).send({ name: 'No mail', email: 'not-an-email' }).expect(400);
    expect(bad.body.error.issues[0].message).toBe('Enter a valid e-mail address.');
    const cid = add.body.contact.id;
    const upd = await qm.put(`/api/customers/${customerId}/contacts/${cid}`).send({ name: 'Hana Ashdown', email: 'h.ashdown@ridgeway-kilns.example.com', receivesCertificates: false }).expect(200);
    expect(upd.body.contact.receivesCertificates).toBe(false);
    expect(await t.deps.database.query(`select 1 from customer_contacts where id = $1 and receives_certificates = false`, [cid])).toHaveLength(1);
    await qm.put(`/api/customers/${customerId}/contacts/${UNKNOWN}`).send({ name: 'X', email: 'x@example.org' }).expect(404);
    await qm.delete(`/api/customers/${customerId}/contacts/${cid}`).expect(204);
    await qm.delete(`/api/customers/${customerId}/contacts/${cid}`).expect(404);
    const actions = await t.database.query<{ action: string }>(`select action from audit_log where entity = 'customer_contact' and entity_id = $1 order by seq`, [cid]);
    expect(actions.map((a) => a.action)).toEqual(['create', 'update', 'delete']);
  });

  it('items: add, refuse the same instrument twice, update; another customer\'s item is 404 here', async () => {
    const add = await qm.post(`/api/customers/${customerId}/items`).send({ description: 'Handheld infrared thermometer', maker: 'Test Maker', model: 'T1', serialNumber: 'SN-1' }).expect(201);
    const id = add.body.item.id;
    await qm.post(`/api/customers/${customerId}/items`).send({ description: 'Same again', maker: 'Test Maker', model: 'T1', serialNumber: 'SN-1' }).expect(409);
    const bad = await qm.post(`/api/customers/${customerId}/items`).send({ description: 'No serial' }).expect(400);
    expect(bad.body.error.issues[0]).toMatchObject({ path: ['body', 'serialNumber'] });
    const upd = await qm.put(`/api/customers/${customerId}/items/${id}`).send({ description: 'Handheld IR thermometer', maker: 'Test Maker', model: 'T1', serialNumber: 'SN-1', notes: 'lens scratched' }).expect(200);
    expect(upd.body.item.notes).toBe('lens scratched');
    const { customers } = customerListSchema.parse((await analyst.get('/api/customers').expect(200)).body);
    const other = customers.find((c) => c.id !== customerId)!;
    await qm.put(`/api/customers/${other.id}/items/${id}`).send({ description: 'x', serialNumber: 'y' }).expect(404);
    const detail = customerDetailSchema.parse((await analyst.get(`/api/customers/${customerId}`).expect(200)).body.customer);
    expect(detail.items).toHaveLength(1);
    const items = itemListSchema.parse((await analyst.get(`/api/customers/${customerId}/items`).expect(200)).body);
    expect(items.items[0].id).toBe(id);
    await analyst.get(`/api/customers/${UNKNOWN}/items`).expect(404);
  });

  it('roles: analysts and signatories read but cannot change; admins manage; customers and anonymous get 403/401', async () => {
    await analyst.post('/api/customers').send({ organisation: 'By analyst' }).expect(403);
    await analyst.post(`/api/customers/${customerId}/contacts`).send({ name: 'A', email: 'a@example.org' }).expect(403);
    await analyst.post(`/api/customers/${customerId}/items`).send({ description: 'x', serialNumber: 'y' }).expect(403);
    await analyst.put(`/api/customers/${customerId}`).send({ organisation: 'x' }).expect(403);
    const signatory = await t.signIn('signatory');
    await signatory.get(`/api/customers/${customerId}`).expect(200);
    const admin = await t.signIn('admin');
    await admin.post(`/api/customers/${customerId}/contacts`).send({ name: 'Admin Added', email: 'admin.added@example.org' }).expect(201);
    const customer = await t.signIn('customer');
    await customer.get('/api/items').expect(403);
    await customer.get(`/api/customers/${customerId}`).expect(403);
    await request(t.app).get('/api/items').expect(401);
    await request(t.app).post('/api/customers').send({ organisation: 'x' }).expect(401);
  });
});
