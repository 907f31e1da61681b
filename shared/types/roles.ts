/** Who a signed-in person is to Perpend. Anonymous visitors have no role: they are the public. */
export const roles = ['specifier', 'officer', 'manager', 'admin'] as const
export type Role = typeof roles[number]

/** Staff work the desk; managers and admins inherit everything officers may do. */
export const staffRoles: readonly Role[] = ['officer', 'manager', 'admin']

export const roleLabels: Record<Role, string> = {
  specifier: 'Specifier',
  officer: 'Technical officer',
  manager: 'Department manager',
  admin: 'Administrator',
}
