// Demo sign-ins for the local demo data. Invented people; shown only in demo mode.
export const DEMO_PASSWORD = 'lacewright-demo';

export const DEMO_ACCOUNTS = [
  { label: 'Rider', email: 'rider@demo.lacewright.test', password: DEMO_PASSWORD },
  { label: 'Builder', email: 'builder@demo.lacewright.test', password: DEMO_PASSWORD },
  { label: 'Admin', email: 'admin@demo.lacewright.test', password: DEMO_PASSWORD },
] as const;
