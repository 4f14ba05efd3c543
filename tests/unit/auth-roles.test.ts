import { describe, expect, it } from 'vitest';
import { hasRole, navigationFor, pageRoles, roles } from '@/lib/domain/roles';

describe('role helper', () => {
  it('allows only the listed roles', () => {
    expect(hasRole({ role: 'admin' }, ['admin'])).toBe(true);
    expect(hasRole({ role: 'installer' }, ['admin'])).toBe(false);
    expect(hasRole({ role: 'inspector' }, ['installer', 'inspector'])).toBe(true);
    expect(hasRole(null, roles)).toBe(false);
    expect(hasRole(undefined, ['installer'])).toBe(false);
  });

  it('gives each role its navigation, and everyone Account', () => {
    expect(navigationFor('installer').map((n) => n.label)).toEqual(['Projects', 'Quick check', 'Appliance library', 'Company', 'Account']);
    expect(navigationFor('inspector').map((n) => n.label)).toEqual(['Inspections', 'Account']);
    expect(navigationFor('admin').map((n) => n.label)).toEqual(['Rules', 'Jurisdictions', 'Users', 'Account']);
  });

  it('lets every role open the pages in its own navigation', () => {
    for (const role of roles) {
      for (const item of navigationFor(role)) {
        expect(pageRoles[item.href], item.href).toBeDefined();
        expect(pageRoles[item.href]).toContain(role);
      }
    }
  });

  it('keeps admin pages from installers and inspectors', () => {
    for (const page of ['/rules', '/jurisdictions', '/users']) {
      expect(pageRoles[page]).toEqual(['admin']);
    }
    expect(pageRoles['/projects']).not.toContain('inspector');
    expect(pageRoles['/inspections']).not.toContain('installer');
  });
});
