import type { Role } from './roles'

// The session carries who the person is and nothing secret; the server re-reads the user on every request.
declare module '#auth-utils' {
  interface User {
    id: number
    name: string
    email: string
    role: Role
    organisationId: number | null
  }
  interface UserSession {
    signedInAt: number
  }
}

export {}
