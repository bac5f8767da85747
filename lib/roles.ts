/**
 * Who may do what: the roles table of the product brief as data. The server guard enforces it;
 * the UI only reads it to hide controls a person cannot use.
 */
export const ROLES = ['manager', 'scout', 'pruner', 'advisor'] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = {
  'manage-organisation': ['manager'],
  'record-observations': ['manager', 'scout', 'pruner'],
  'edit-any-observation': ['manager'],
  'edit-own-observation': ['manager', 'scout', 'pruner'],
  'flag-vine': ['manager', 'scout', 'pruner'],
  'manage-tasks': ['manager'],
  // Sampling plans are usually drawn up by the consulting viticulturist.
  'plan-sampling': ['manager', 'advisor'],
  'complete-task': ['manager', 'pruner'],
  // Not in the DESIGN table: the flags-and-tasks issue has a crew lead (pruner) or a manager check pruning.
  'check-pruning': ['manager', 'pruner'],
  // DESIGN table: "record row work (pruning, brush, tying)".
  'record-row-work': ['manager', 'pruner'],
  comment: ['manager', 'scout', 'pruner', 'advisor'],
  read: ['manager', 'scout', 'pruner', 'advisor'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

/** The landing page after sign-in: desk for those who review, field for those who walk rows. */
export function homeFor(role: Role): '/desk' | '/field' {
  return role === 'manager' || role === 'advisor' ? '/desk' : '/field';
}
