import { describe, expect, it } from 'vitest';
import { can, homeFor, PERMISSIONS, ROLES, type Permission, type Role } from '@/lib/roles';

// The roles table of DESIGN.md, row by row, written out independently of lib/roles.ts.
const TABLE: [Permission, Record<Role, boolean>][] = [
  ['manage-organisation', { manager: true, scout: false, pruner: false, advisor: false }],
  ['record-observations', { manager: true, scout: true, pruner: true, advisor: false }],
  ['edit-any-observation', { manager: true, scout: false, pruner: false, advisor: false }],
  ['edit-own-observation', { manager: true, scout: true, pruner: true, advisor: false }],
  ['flag-vine', { manager: true, scout: true, pruner: true, advisor: false }],
  ['manage-tasks', { manager: true, scout: false, pruner: false, advisor: false }],
  // Not in the DESIGN table: the field-scouting issue says plans are made "by a manager or advisor".
  ['plan-sampling', { manager: true, scout: false, pruner: false, advisor: true }],
  ['complete-task', { manager: true, scout: false, pruner: true, advisor: false }],
  // Not in the DESIGN table: the flags-and-tasks issue has a crew lead (pruner) or a manager check pruning.
  ['check-pruning', { manager: true, scout: false, pruner: true, advisor: false }],
  // DESIGN table: "record row work (pruning, brush, tying)" — manager and pruner.
  ['record-row-work', { manager: true, scout: false, pruner: true, advisor: false }],
  ['comment', { manager: true, scout: true, pruner: true, advisor: true }],
  ['read', { manager: true, scout: true, pruner: true, advisor: true }],
];

describe('roles', () => {
  it('covers every permission of the design roles table', () => {
    expect(Object.keys(PERMISSIONS).sort()).toEqual(TABLE.map(([p]) => p).sort());
  });

  it.each(TABLE)('grants %s exactly as the design table says', (permission, expected) => {
    for (const role of ROLES) expect(can(role, permission), `${role} / ${permission}`).toBe(expected[role]);
  });

  it('sends people who walk rows to the field and reviewers to the desk', () => {
    expect(homeFor('scout')).toBe('/field');
    expect(homeFor('pruner')).toBe('/field');
    expect(homeFor('manager')).toBe('/desk');
    expect(homeFor('advisor')).toBe('/desk');
  });
});
