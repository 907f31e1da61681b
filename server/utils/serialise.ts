import type { Organisation, User } from '../models'

/** The shape of a person that leaves the server: never the password hash. */
export function publicUser(user: User) {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    organisationId: user.organisationId ?? null,
    phone: user.phone,
    emailVerified: !!user.emailVerifiedAt,
    active: !user.deactivatedAt,
    lastSignInAt: user.lastSignInAt,
    createdAt: user.createdAt,
  }
}

export function publicOrganisation(org: Organisation) {
  return { id: org.id, name: org.name, kind: org.kind, mergedIntoId: org.mergedIntoId ?? null, createdAt: org.createdAt }
}
