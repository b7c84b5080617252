/**
 * The main navigation's shape per role: short ones stay flat, long ones gather under groups, and
 * every screen a role finds in the navigation appears exactly once either way.
 */
import { describe, expect, it } from 'vitest';
import { ROLES } from '../../src/contracts/roles';
import { navEntries } from '../../src/app/Nav';
import { navFor } from '../../src/app/screens';

const flatten = (role: (typeof ROLES)[number]) =>
  navEntries(role).flatMap((e) => (e.kind === 'link' ? [e.screen.id] : e.screens.map((s) => s.id)));

describe('navEntries', () => {
  it.each(ROLES)('%s: every navigation screen once, in the table order', (role) => {
    expect(flatten(role)).toEqual(navFor(role).map((s) => s.id));
  });

  it('keeps a short navigation flat and gathers a long one into groups of at least two', () => {
    const floor = navEntries('floor');
    expect(floor.every((e) => e.kind === 'link')).toBe(true);
    const admin = navEntries('admin');
    expect(navFor('admin').length).toBeGreaterThan(7);
    expect(admin.length).toBeLessThan(navFor('admin').length);
    for (const e of admin) if (e.kind === 'group') expect(e.screens.length).toBeGreaterThanOrEqual(2);
    // Home stays a link of its own.
    expect(admin[0]).toMatchObject({ kind: 'link', screen: { id: 'home' } });
  });
});
