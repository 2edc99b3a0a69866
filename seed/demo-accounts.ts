// The invented demo company and its sign-ins. Everything here is made up for the demo.
import type { Role } from '../shared/permissions';

export const DEMO_COMPANY = 'Halyard Reefer Leasing';
export const DEMO_PASSWORD = 'halyard-demo-2026';

export const DEMO_ACCOUNTS: { email: string; name: string; role: Role; certificateNumber: string | null }[] = [
  { email: 'tech@halyard.example', name: 'Ines Marlow', role: 'technician', certificateNumber: 'HX-CERT-40117' },
  { email: 'engineer@halyard.example', name: 'Tomas Reyvik', role: 'engineer', certificateNumber: 'HX-CERT-38802' },
  { email: 'owner@halyard.example', name: 'Priya Castellane', role: 'owner', certificateNumber: null },
  { email: 'admin@halyard.example', name: 'Oskar Lindqvale', role: 'admin', certificateNumber: null },
];
