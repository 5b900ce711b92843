// The three roles and their order: each role can do everything the one below it can. Pure.
export const ROLES = ['operator', 'crib_manager', 'owner'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  operator: 'Operator',
  crib_manager: 'Crib manager',
  owner: 'Owner',
}

export function roleAtLeast(role: Role, needed: Role): boolean {
  return ROLES.indexOf(role) >= ROLES.indexOf(needed)
}
