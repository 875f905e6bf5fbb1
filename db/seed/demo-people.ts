/**
 * The demo scenario: an invented PT provider and invented labs. No real organisation, person or
 * brand. Every demo account shares the demo password printed at start.
 */
export const DEMO_PROVIDER = { name: 'Larkspur Interlaboratory Services', country: 'Nowhere' };

export const DEMO_LABS = [
  { key: 'lab1', name: 'Aldergrove Colloid Laboratory', country: 'Northland' },
  { key: 'lab2', name: 'Birchmere Particle Analytics', country: 'Eastmark' },
  { key: 'lab3', name: 'Cobalt Bay Nanometrology', country: 'Westvale' },
  { key: 'lab4', name: 'Dunmore Materials Testing', country: 'Southreach' },
] as const;

/** The other labs of the scheme (no demo sign-in; they appear to others only by code). */
export const OTHER_LABS = [
  'Eskerfield Dispersion Lab',
  'Fenwick Hollow Analytical',
  'Glenmarsh Formulation QC',
  'Harrowgate Surface Science',
  'Ivybridge Colloid Core Facility',
  'Juniper Point Instrument Service',
  'Kestrel Ridge Contract Lab',
  'Larchwood University Particle Centre',
  'Millbrook Pharma Quality Lab',
  'Northcliff Nanomaterials Unit',
  'Oakhaven Measurement Services',
  'Pinecrest Biologics Analytics',
  'Quarry Lane Testing House',
  'Rowan Heath Physics Core',
  'Saltmarsh Applied Colloids',
  'Thornbury Light Scattering Lab',
  'Upperfold Quality Laboratory',
  'Valemount Particle Lab',
  'Westerholm Dispersions QC',
  'Yarrowby Research Core',
  'Zephyr Cove Analytical',
  'Ashcombe Polymer Testing',
] as const;

export const DEMO_USERS = [
  {
    email: 'admin@ringlet.example',
    name: 'Ada Admin',
    roles: ['admin'],
    lab: null,
    manager: false,
  },
  {
    email: 'coordinator@ringlet.example',
    name: 'Cora Coordinator',
    roles: ['coordinator'],
    lab: null,
    manager: false,
  },
  {
    email: 'assessor@ringlet.example',
    name: 'Asa Assessor',
    roles: ['assessor'],
    lab: null,
    manager: false,
  },
  { email: 'lab1@ringlet.example', name: 'Lena Lindqvist', roles: [], lab: 'lab1', manager: true },
  { email: 'lab2@ringlet.example', name: 'Bram Oduya', roles: [], lab: 'lab2', manager: true },
  { email: 'lab3@ringlet.example', name: 'Chiara Venn', roles: [], lab: 'lab3', manager: true },
  { email: 'lab4@ringlet.example', name: 'Dev Halloran', roles: [], lab: 'lab4', manager: true },
] as const;

/** Used only in demo mode; RINGLET_DEMO_PASSWORD overrides it. */
export const DEFAULT_DEMO_PASSWORD = 'ringlet-demo-2026';
