/**
 * The demo scenario: an invented PT provider and invented labs. No real organisation, person or
 * brand. Every demo account shares the demo password printed at start.
 */
export const DEMO_PROVIDER = { name: 'Ringlet Demo PT Provider', country: 'Nowhere' };

export const DEMO_LABS = [
  { key: 'lab1', name: 'Aldergrove Colloid Laboratory', country: 'Northland' },
  { key: 'lab2', name: 'Birchmere Particle Analytics', country: 'Eastmark' },
  { key: 'lab3', name: 'Cobalt Bay Nanometrology', country: 'Westvale' },
  { key: 'lab4', name: 'Dunmore Materials Testing', country: 'Southreach' },
] as const;

export const DEMO_USERS = [
  { email: 'admin@ringlet.example', name: 'Ada Admin', roles: ['admin'], lab: null, manager: false },
  { email: 'coordinator@ringlet.example', name: 'Cora Coordinator', roles: ['coordinator'], lab: null, manager: false },
  { email: 'assessor@ringlet.example', name: 'Asa Assessor', roles: ['assessor'], lab: null, manager: false },
  { email: 'lab1@ringlet.example', name: 'Lena Lindqvist', roles: [], lab: 'lab1', manager: true },
  { email: 'lab2@ringlet.example', name: 'Bram Oduya', roles: [], lab: 'lab2', manager: true },
  { email: 'lab3@ringlet.example', name: 'Chiara Venn', roles: [], lab: 'lab3', manager: true },
  { email: 'lab4@ringlet.example', name: 'Dev Halloran', roles: [], lab: 'lab4', manager: true },
] as const;

/** Used only in demo mode; RINGLET_DEMO_PASSWORD overrides it. */
export const DEFAULT_DEMO_PASSWORD = 'ringlet-demo-2026';
