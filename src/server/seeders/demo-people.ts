/** The invented demo shop and its members, one per role. Not real people or a real shop. */
export const DEMO_PASSWORD = 'torquetrail-demo';

export const DEMO_SHOP = { name: 'Hollow Pine Rebuild (demo)', slug: 'hollow-pine-demo' } as const;

export const DEMO_MEMBERS = [
  { role: 'owner', name: 'Olga Ostrander', email: 'olga.owner@demo.torquetrail.test' },
  { role: 'lead', name: 'Lars Lindqvist', email: 'lars.lead@demo.torquetrail.test' },
  { role: 'technician', name: 'Tess Tamura', email: 'tess.tech@demo.torquetrail.test' },
  { role: 'reviewer', name: 'Rui Ribeiro', email: 'rui.reviewer@demo.torquetrail.test' },
] as const;
