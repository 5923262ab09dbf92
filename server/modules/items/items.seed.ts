import { eq } from 'drizzle-orm';
import type { SeedStep } from '../../db/seed';
import { customers } from '../../db/schema';
import { recordAudit } from '../../audit';
import { DEMO_CUSTOMERS } from '../../db/seed/demo-data';
import { createItemsRepository } from './items.repository';

/* Demo instruments of the demo customers. Makers, models and serial numbers are invented. */
export const DEMO_ITEMS: Array<{ customerKey: (typeof DEMO_CUSTOMERS)[number]['key']; description: string; maker: string; model: string; serialNumber: string; notes?: string }> = [
  { customerKey: 'glassworks', description: 'Handheld infrared thermometer', maker: 'Tallowmere Instruments (demo)', model: 'HT-8', serialNumber: 'TM8-20417' },
  { customerKey: 'glassworks', description: 'Fixed-mount radiation thermometer, 1 µm', maker: 'Tallowmere Instruments (demo)', model: 'FX-1000', serialNumber: 'FX1-00962', notes: 'Lehr exit; emissivity setting 0.85 in use.' },
  { customerKey: 'foods', description: 'Handheld infrared thermometer', maker: 'Quillon Sensing (demo)', model: 'Q-Spot 5', serialNumber: 'QS5-118402' },
  { customerKey: 'foods', description: 'Handheld infrared thermometer', maker: 'Quillon Sensing (demo)', model: 'Q-Spot 5', serialNumber: 'QS5-118577' },
  { customerKey: 'thermal', description: 'Thermal imager', maker: 'Orrin Optics (demo)', model: 'VistaTherm 320', serialNumber: 'VT320-7731' },
  { customerKey: 'thermal', description: 'Portable blackbody source', maker: 'Orrin Optics (demo)', model: 'CalPlate 350', serialNumber: 'CP350-0410' },
];

export const itemsSeedStep: SeedStep = {
  name: 'demo-customer-items',
  async run({ db, clock }) {
    const repo = createItemsRepository(db);
    const now = clock();
    for (const i of DEMO_ITEMS) {
      const organisation = DEMO_CUSTOMERS.find((c) => c.key === i.customerKey)!.organisation;
      const [org] = await db.select({ id: customers.id }).from(customers).where(eq(customers.organisation, organisation));
      const fields = { description: i.description, maker: i.maker, model: i.model, serialNumber: i.serialNumber, notes: i.notes ?? '' };
      const id = await repo.insert(org.id, fields, now, db);
      await recordAudit(db, { actor: null, action: 'create', entity: 'customer_item', entityId: id, after: { customerId: org.id, ...fields }, at: now });
    }
  },
};
