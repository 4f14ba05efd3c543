export type Role = 'installer' | 'inspector' | 'admin';
export const roles: readonly Role[] = ['installer', 'inspector', 'admin'];

export type AppUser = {
  id: string;
  email: string;
  name: string;
  role: Role;
  organizationId: string | null;
  jurisdictionId: string | null;
  /** An installer who manages their company's people and settings. */
  isOwner: boolean;
  isDemo: boolean;
};

export function hasRole(user: Pick<AppUser, 'role'> | null | undefined, allowed: readonly Role[]): boolean {
  return !!user && allowed.includes(user.role);
}

export type NavItem = { href: string; label: string };

/** The app shell's navigation for each role. */
export function navigationFor(role: Role): NavItem[] {
  const byRole: Record<Role, NavItem[]> = {
    installer: [
      { href: '/projects', label: 'Projects' },
      { href: '/quick-check', label: 'Quick check' },
      { href: '/appliances', label: 'Appliance library' },
      { href: '/company', label: 'Company' },
    ],
    inspector: [{ href: '/inspections', label: 'Inspections' }],
    admin: [
      { href: '/rules', label: 'Rules' },
      { href: '/jurisdictions', label: 'Jurisdictions' },
      { href: '/users', label: 'Users' },
    ],
  };
  return [...byRole[role], { href: '/account', label: 'Account' }];
}

/** Which app pages each role may open; the page itself checks again server-side. */
export const pageRoles: Record<string, readonly Role[]> = {
  '/projects': ['installer', 'admin'],
  '/appliances': ['installer'],
  '/quick-check': ['installer'],
  '/inspections': ['inspector', 'admin'],
  // Installers who own their company only; the page checks that too.
  '/people': ['installer'],
  '/audit': ['installer', 'admin'],
  '/rules': ['admin'],
  '/jurisdictions': ['admin'],
  '/users': ['admin'],
  '/company': ['installer'],
  '/account': roles,
};

/** The navigation for this person: their role's, with people administration for company owners and the audit log. */
export function navigationForUser(user: Pick<AppUser, 'role' | 'isOwner'>): NavItem[] {
  const items = navigationFor(user.role);
  const extra: NavItem[] =
    user.role === 'admin' ? [{ href: '/audit', label: 'Audit' }]
    : user.role === 'installer' && user.isOwner ? [{ href: '/people', label: 'People' }, { href: '/audit', label: 'Audit' }]
    : [];
  // Before "Account", which stays last.
  return [...items.slice(0, -1), ...extra, ...items.slice(-1)];
}
