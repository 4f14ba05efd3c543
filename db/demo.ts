// The demo scenario: invented companies, people and jurisdictions for local use and tests only.
import type { NewJurisdiction, Role } from './types';

export const DEMO_EMAIL_DOMAIN = 'nookpass.demo';

export const demoOrganizations = [
  { key: 'closet-works', name: 'Demo Closet Works', license_number: 'DEMO-HIC-000123' },
  { key: 'second-company', name: 'Demo Second Company', license_number: 'DEMO-HIC-000456' },
] as const;

export const demoJurisdictions: (NewJurisdiction & { slug: string })[] = [
  {
    slug: 'demo-county',
    name: 'Demo County',
    region: 'Demo State (invented)',
    building_edition: 'IRC 2018',
    electrical_edition: 'NEC 2017',
    plumbing_edition: 'IPC 2018',
    plumbing_family: 'IPC',
    mechanical_edition: 'IMC 2018',
    fuel_gas_edition: 'IFGC 2018',
    inspector_email: 'inspector@nookpass.demo',
    amendment_notes: 'Demo jurisdiction. Adopts the 2018 I-codes and NEC 2017 without local amendments.',
    is_demo: true,
  },
  {
    slug: 'demo-city',
    name: 'Demo City',
    region: 'Demo State (invented)',
    building_edition: 'IRC 2021',
    electrical_edition: 'NEC 2023',
    plumbing_edition: 'UPC 2021',
    plumbing_family: 'UPC',
    mechanical_edition: 'IMC 2021',
    fuel_gas_edition: 'IFGC 2021',
    inspector_email: 'permits@nookpass.demo',
    amendment_notes:
      'Demo jurisdiction. Local amendment: a clothes washer installed over finished space needs a drain pan drained to an approved receptor.',
    is_demo: true,
  },
];

export type DemoUser = {
  email: string;
  name: string;
  role: Role;
  organization?: (typeof demoOrganizations)[number]['key'];
  jurisdiction?: string;
};

export const demoUsers: DemoUser[] = [
  { email: 'installer@nookpass.demo', name: 'Robin Demo (installer)', role: 'installer', organization: 'closet-works' },
  { email: 'installer2@nookpass.demo', name: 'Sam Demo (installer)', role: 'installer', organization: 'closet-works' },
  { email: 'other-installer@nookpass.demo', name: 'Alex Demo (installer)', role: 'installer', organization: 'second-company' },
  { email: 'inspector@nookpass.demo', name: 'Jordan Demo (inspector)', role: 'inspector', jurisdiction: 'demo-county' },
  { email: 'admin@nookpass.demo', name: 'Casey Demo (admin)', role: 'admin' },
];

export function demoPassword(): string {
  return process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password';
}
