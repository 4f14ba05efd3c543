// The demo scenario: invented companies, people and jurisdictions for local use and tests only.
import type { NewJurisdiction, Role } from '@/db/types';
import type { RuleSetOverrides } from '@/rules';

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
    time_zone: 'America/Denver',
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
    time_zone: 'America/Chicago',
    is_demo: true,
  },
];

/** Local amendments recorded in each demo jurisdiction's first rule set version. */
export const demoAmendments: Record<string, { changelog: string; overrides: RuleSetOverrides }> = {
  'demo-county': {
    changelog: 'Version 1 (demo): the 2018 I-codes and NEC 2017 as published, no local amendments.',
    overrides: {},
  },
  'demo-city': {
    changelog:
      'Version 1 (demo): IRC 2021, NEC 2023 and UPC 2021. Local amendment DC-406.3: a washer over finished space needs a drain pan drained to an approved receptor.',
    overrides: { parameters: { plumbing: { drainPanPolicy: 'over-finished-space', drainPanSection: 'DC-406.3 (local amendment, demo)' } } },
  },
};

/** Demo projects: which company, where, and which invented plan. */
export const demoProjects = [
  { organization: 'closet-works', jurisdiction: 'demo-county', plan: 'demo-hall-closet', name: 'Demo — hall closet pair, 12 Example Lane', siteAddress: '12 Example Lane, Demo County (invented)' },
  { organization: 'closet-works', jurisdiction: 'demo-county', plan: 'demo-long-exhaust', name: 'Demo — bypass-door closet, 48 Sample Road', siteAddress: '48 Sample Road, Demo County (invented)' },
  { organization: 'closet-works', jurisdiction: 'demo-city', plan: 'demo-gas-walk-in', name: 'Demo — walk-in closet gas dryer, 7 Placeholder Court', siteAddress: '7 Placeholder Court, Demo City (invented)' },
  { organization: 'second-company', jurisdiction: 'demo-city', plan: 'demo-hall-closet', name: 'Demo — second company hall closet, 300 Fictional Ave', siteAddress: '300 Fictional Ave, Demo City (invented)' },
] as const;

export type DemoUser = {
  email: string;
  name: string;
  role: Role;
  organization?: (typeof demoOrganizations)[number]['key'];
  jurisdiction?: string;
  /** Manages the company's people and settings. */
  owner?: boolean;
};

export const demoUsers: DemoUser[] = [
  { email: 'installer@nookpass.demo', name: 'Robin Demo (installer)', role: 'installer', organization: 'closet-works', owner: true },
  { email: 'installer2@nookpass.demo', name: 'Sam Demo (installer)', role: 'installer', organization: 'closet-works' },
  { email: 'other-installer@nookpass.demo', name: 'Alex Demo (installer)', role: 'installer', organization: 'second-company' },
  { email: 'inspector@nookpass.demo', name: 'Jordan Demo (inspector)', role: 'inspector', jurisdiction: 'demo-county' },
  { email: 'admin@nookpass.demo', name: 'Casey Demo (admin)', role: 'admin' },
];

export function demoPassword(): string {
  return process.env.NOOKPASS_DEMO_PASSWORD || 'demo-password';
}
