import type { DemoSupplier, DemoUser } from './scenario-types';

/** A demo supplier plus the one person who signs in for it. */
interface SupplierEntry extends DemoSupplier {
  contactName: string;
  contactEmail: string;
}

/*
 * Invented firms of a floor-scrubber supply base. Far-away or bulky goods (steel, batteries,
 * controllers, tanks) have long lead times and weekly deliveries; local kit and harness shops
 * deliver daily. Cycles are written days–deliveries–delay as on the Loops screen.
 */
const SUPPLIER_ENTRIES: SupplierEntry[] = [
  {
    code: 'FBS',
    name: 'Ferncombe Battery Supply',
    email: 'ferncombe.orders@example.net',
    leadTimeDays: 7,
    cycleDays: 5,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
    contactName: 'Lena Haverford',
    contactEmail: 'ferncombe.lena@example.net',
  },
  {
    code: 'OMW',
    name: 'Oldwick Motor Winding',
    email: 'oldwick.orders@example.com',
    leadTimeDays: 6,
    cycleDays: 5,
    deliveriesPerCycle: 2,
    deliveryDelay: 1,
    contactName: 'Marcus Teague',
    contactEmail: 'oldwick.marcus@example.com',
  },
  {
    code: 'GDC',
    name: 'Greyhithe Drive Controls',
    email: 'greyhithe.orders@example.org',
    leadTimeDays: 8,
    cycleDays: 5,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
    contactName: 'Joanna Pellow',
    contactEmail: 'greyhithe.joanna@example.org',
  },
  {
    code: 'BHC',
    name: 'Brackmoor Harness Shop',
    email: 'brackmoor.orders@example.net',
    leadTimeDays: 4,
    cycleDays: 1,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
    contactName: 'Rafael Ostrander',
    contactEmail: 'brackmoor.rafael@example.net',
  },
  {
    code: 'SRM',
    name: 'Saltmarsh Rotomoulding',
    email: 'saltmarsh.orders@example.com',
    leadTimeDays: 8,
    cycleDays: 5,
    deliveriesPerCycle: 2,
    deliveryDelay: 1,
    contactName: 'Hana Briscombe',
    contactEmail: 'saltmarsh.hana@example.com',
  },
  {
    code: 'WSS',
    name: 'Wendle Squeegee and Seal',
    email: 'wendle.orders@example.org',
    leadTimeDays: 4,
    cycleDays: 5,
    deliveriesPerCycle: 2,
    deliveryDelay: 1,
    contactName: 'Idris Valeman',
    contactEmail: 'wendle.idris@example.org',
  },
  {
    code: 'CBP',
    name: 'Cobbleford Brush and Pad',
    email: 'cobbleford.orders@example.net',
    leadTimeDays: 5,
    cycleDays: 5,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
    contactName: 'Petra Lindmoor',
    contactEmail: 'cobbleford.petra@example.net',
  },
  {
    code: 'ECW',
    name: 'Elmstead Caster and Wheel',
    email: 'elmstead.orders@example.com',
    leadTimeDays: 5,
    cycleDays: 5,
    deliveriesPerCycle: 2,
    deliveryDelay: 1,
    contactName: 'Colm Ashbury',
    contactEmail: 'elmstead.colm@example.com',
  },
  {
    code: 'PFK',
    name: 'Pinmoor Fastener Kits',
    email: 'pinmoor.orders@example.org',
    leadTimeDays: 3,
    cycleDays: 1,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
    contactName: 'Sunita Raofield',
    contactEmail: 'pinmoor.sunita@example.org',
  },
  {
    code: 'HSS',
    name: 'Heronbank Sheet and Section',
    email: 'heronbank.orders@example.net',
    leadTimeDays: 10,
    cycleDays: 5,
    deliveriesPerCycle: 1,
    deliveryDelay: 2,
    contactName: 'Tobias Wrenfield',
    contactEmail: 'heronbank.tobias@example.net',
  },
  {
    code: 'LLD',
    name: 'Lindenfold Label and Print',
    email: 'lindenfold.orders@example.com',
    leadTimeDays: 3,
    cycleDays: 5,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
    contactName: 'Greta Oaksmith',
    contactEmail: 'lindenfold.greta@example.com',
  },
  {
    code: 'BCP',
    name: 'Birchwell Crate and Pallet',
    email: 'birchwell.orders@example.org',
    leadTimeDays: 2,
    cycleDays: 1,
    deliveriesPerCycle: 2,
    deliveryDelay: 1,
    contactName: 'Emeka Dunmore',
    contactEmail: 'birchwell.emeka@example.org',
  },
  {
    code: 'TFP',
    name: 'Tallowford Fluid Parts',
    email: 'tallowford.orders@example.net',
    leadTimeDays: 5,
    cycleDays: 5,
    deliveriesPerCycle: 2,
    deliveryDelay: 1,
    contactName: 'Mira Kestrelle',
    contactEmail: 'tallowford.mira@example.net',
  },
  {
    code: 'COS',
    name: 'Copperdell Operator Seating',
    email: 'copperdell.orders@example.com',
    leadTimeDays: 6,
    cycleDays: 5,
    deliveriesPerCycle: 1,
    deliveryDelay: 1,
    contactName: 'Anselm Roweth',
    contactEmail: 'copperdell.anselm@example.com',
  },
];

/** Plant staff, one per in-house role; names are invented. */
const STAFF: DemoUser[] = [
  { email: 'admin@example.com', name: 'Avery Lindholm', role: 'admin', supplierCode: null },
  { email: 'planner@example.com', name: 'Noor Castellan', role: 'planner', supplierCode: null },
  { email: 'buyer@example.com', name: 'Theo Marwick', role: 'buyer', supplierCode: null },
  { email: 'receiving@example.com', name: 'Keisha Doran', role: 'receiving', supplierCode: null },
  { email: 'line@example.com', name: 'Ravi Okonkwo', role: 'line', supplierCode: null },
  { email: 'viewer@example.com', name: 'Felix Arnwood', role: 'viewer', supplierCode: null },
];

/** The demo suppliers as stored (contact person left out). */
export function demoSuppliers(): DemoSupplier[] {
  return SUPPLIER_ENTRIES.map(({ contactName: _name, contactEmail: _email, ...supplier }) => ({ ...supplier }));
}

/** Plant staff followed by one supplier contact per demo supplier. */
export function demoUsers(): DemoUser[] {
  const contacts = SUPPLIER_ENTRIES.map((entry): DemoUser => ({
    email: entry.contactEmail,
    name: entry.contactName,
    role: 'supplier',
    supplierCode: entry.code,
  }));
  return [...STAFF.map((user) => ({ ...user })), ...contacts];
}
