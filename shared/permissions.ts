// Who may see what: one rule, used by the server to guard routes and by the viewer to hide
// what a role cannot open. Pure.

export const ROLES = ['admin', 'author', 'reviewer', 'bench'] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = [
  'read:formula:active', // active formulas
  'read:formula:draft', // drafts and retired formulas
  'read:history', // revision history and diffs
  'read:plan', // production plans and batch sheets
  'read:catalog', // the ingredient catalog (without prices)
  'read:cost', // prices, costs per piece
  'read:label', // ingredient statements and nutrition declarations
  'manage:users', // accounts
  'read:record', // bench records of the bake days the role may see, their photos, the friction learned
  'write:record', // recording a mix or a build (temperatures, note, photos) and correcting a record
  'manage:records', // hiding a wrong record (kept, marked)
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const GRANTS: Record<Role, readonly Permission[]> = {
  bench: ['read:formula:active', 'read:plan', 'read:catalog', 'read:record', 'write:record'],
  reviewer: ['read:formula:active', 'read:formula:draft', 'read:history', 'read:plan', 'read:catalog', 'read:label', 'read:record', 'write:record'],
  author: ['read:formula:active', 'read:formula:draft', 'read:history', 'read:plan', 'read:catalog', 'read:cost', 'read:label', 'read:record', 'write:record'],
  admin: [...PERMISSIONS],
};

export function isRole(x: unknown): x is Role {
  return typeof x === 'string' && (ROLES as readonly string[]).includes(x);
}

export function roleHasPermission(role: Role, permission: Permission): boolean {
  return GRANTS[role].includes(permission);
}

export function permissionsOf(role: Role): Permission[] {
  return [...GRANTS[role]];
}

/** Whether a role may open a formula of the given status. */
export function canSeeFormulaStatus(role: Role, status: string): boolean {
  return status === 'active' ? roleHasPermission(role, 'read:formula:active') : roleHasPermission(role, 'read:formula:draft');
}
