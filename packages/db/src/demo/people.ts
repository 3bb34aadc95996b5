/**
 * The invented demo outfit. Every name, place and number here is made up for the demo.
 */
export const DEMO_PASSWORD = 'hitchbook-demo';

export const demoOperation = {
  name: 'Quillback Ridge Farms',
  address: '4410 County Road 9, Fenwold Township',
  email: 'office@quillback.example',
  phone: '555-0142',
};

export const demoHouseholds = [
  { key: 'elders', name: 'Arvid & Nell Quillback', relationship: 'family', notes: 'Grandparents; own the older line of equipment.' },
  { key: 'parents', name: 'Jonah & Ilse Quillback', relationship: 'family', notes: 'Run the account day to day.' },
  { key: 'son', name: 'Tavin Quillback', relationship: 'family', notes: 'Grown son; custom mowing on the side.' },
] as const;

export const demoCustomers = [
  { key: 'neighbourA', name: 'Marisol Brandvold', relationship: 'neighbour', email: 'marisol@brandvold.example', address: '2870 Pike Hollow Road, Fenwold Township' },
  { key: 'neighbourB', name: 'Okonkwo Dairy (Emeka Okonkwo)', relationship: 'neighbour', email: 'emeka@okonkwo-dairy.example', address: '611 Saltlick Lane, Fenwold Township' },
  { key: 'township', name: 'Fenwold Township Road District', relationship: 'agency', email: 'roads@fenwold-twp.example', address: 'Township Hall, 1 Commons Street, Fenwold' },
] as const;

type PartyKey = (typeof demoHouseholds)[number]['key'] | (typeof demoCustomers)[number]['key'];

export const demoUsers: ReadonlyArray<{
  email: string;
  name: string;
  role: 'owner' | 'partner' | 'operator' | 'bookkeeper' | 'customer';
  party: PartyKey | null;
}> = [
  { email: 'owner@hitchbook.test', name: 'Ilse Quillback', role: 'owner', party: 'parents' },
  { email: 'partner@hitchbook.test', name: 'Arvid Quillback', role: 'partner', party: 'elders' },
  { email: 'operator@hitchbook.test', name: 'Rudy Calloway', role: 'operator', party: null },
  { email: 'bookkeeper@hitchbook.test', name: 'Pernilla Osgood', role: 'bookkeeper', party: null },
  { email: 'customer@hitchbook.test', name: 'Marisol Brandvold', role: 'customer', party: 'neighbourA' },
  { email: 'customer2@hitchbook.test', name: 'Emeka Okonkwo', role: 'customer', party: 'neighbourB' },
];
