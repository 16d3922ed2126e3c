/** Workspace roles, weakest first: each role may do everything the ones before it may. */
export const ROLES = ['viewer', 'analyst', 'owner'] as const;
export type Role = (typeof ROLES)[number];

export function roleRank(role: Role): number {
  return ROLES.indexOf(role);
}

export function hasRole(actual: Role, minimum: Role): boolean {
  return roleRank(actual) >= roleRank(minimum);
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

export const ROLE_LABELS: Record<Role, string> = {
  viewer: 'Viewer',
  analyst: 'Analyst',
  owner: 'Owner',
};
