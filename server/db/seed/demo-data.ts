import type { Role } from '../../../shared/schemas/roles';

/*
 * The demo scenario. Every name, address, number and e-mail here is invented for the demo;
 * e-mail addresses use the reserved domains .test and example.com (RFC 2606).
 */

/** The one password of every demo account (documented in README). */
export const DEMO_PASSWORD = 'emberline-demo';

export const DEMO_LAB = {
  name: 'Kestrel Vale Radiometry Laboratory (demo)',
  address: 'Unit 4, 17 Lantern Row\nKestrel Vale KV3 9ZZ\nDemoland',
  accreditationNumber: 'DEMO-17025-0427',
  contactEmail: 'lab@emberline-demo.test',
  contactPhone: '+00 555 0100',
};

export const DEMO_CUSTOMERS = [
  {
    key: 'glassworks',
    organisation: 'Brightwater Glassworks Ltd (demo)',
    address: '2 Furnace Yard\nBrightwater BW1 4QQ\nDemoland',
    contacts: [
      { name: 'Mira Holloway', email: 'm.holloway@brightwater-glass.example.com', receivesCertificates: true },
      { name: 'Tomas Reeve', email: 'quality@brightwater-glass.example.com', receivesCertificates: true },
    ],
  },
  {
    key: 'foods',
    organisation: 'Oakhollow Food Processing (demo)',
    address: '88 Millrace Road\nOakhollow OH7 2XX\nDemoland',
    contacts: [{ name: 'Priya Anand-Lowe', email: 'p.anand-lowe@oakhollow-foods.example.com', receivesCertificates: true }],
  },
  {
    key: 'thermal',
    organisation: 'Stonebridge Thermal Services (demo)',
    address: 'Dock 3, Harbour Street\nStonebridge SB5 1YY\nDemoland',
    contacts: [
      { name: 'Jonah Whitcombe', email: 'j.whitcombe@stonebridge-thermal.example.com', receivesCertificates: true },
      { name: 'Lena Marsh', email: 'accounts@stonebridge-thermal.example.com', receivesCertificates: false },
    ],
  },
] as const;

export type DemoUser = { role: Role; name: string; email: string; customerKey?: (typeof DEMO_CUSTOMERS)[number]['key'] };

/** One user per role; the customer user belongs to the first customer organisation. */
export const DEMO_USERS: readonly DemoUser[] = [
  { role: 'admin', name: 'Alex Admin (demo)', email: 'admin@emberline-demo.test' },
  { role: 'quality_manager', name: 'Quinn Quality (demo)', email: 'quality@emberline-demo.test' },
  { role: 'analyst', name: 'Ana Analyst (demo)', email: 'analyst@emberline-demo.test' },
  { role: 'signatory', name: 'Sam Signatory (demo)', email: 'signatory@emberline-demo.test' },
  { role: 'customer', name: 'Mira Holloway (demo)', email: 'customer@emberline-demo.test', customerKey: 'glassworks' },
];
