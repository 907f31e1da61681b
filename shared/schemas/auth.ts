import { z } from 'zod'
import { roles } from '../types/roles'

export const roleSchema = z.enum(roles)

export const emailSchema = z.string().trim().toLowerCase().max(254, 'That e-mail address is too long').pipe(z.email('Enter a valid e-mail address'))

export const newPasswordSchema = z.string()
  .min(10, 'Use at least 10 characters for the password')
  .max(200, 'Use at most 200 characters for the password')

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(200),
})
export type SignInInput = z.infer<typeof signInSchema>

export const organisationKinds = ['architect', 'engineer', 'energy-assessor', 'builder', 'developer', 'supplier', 'other'] as const
export const organisationKindSchema = z.enum(organisationKinds)

export const registerSchema = z.object({
  name: z.string().trim().min(2, 'Enter your name').max(200),
  email: emailSchema,
  password: newPasswordSchema,
  organisationName: z.string().trim().min(2, 'Enter your organisation').max(200),
  organisationKind: organisationKindSchema.default('other'),
  phone: z.string().trim().max(40).optional(),
})
export type RegisterInput = z.infer<typeof registerSchema>

export const tokenSchema = z.object({
  token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'This link is not valid'),
})

export const forgotPasswordSchema = z.object({ email: emailSchema })

export const setPasswordSchema = tokenSchema.extend({ password: newPasswordSchema })

export const inviteStaffSchema = z.object({
  name: z.string().trim().min(2, 'Enter the name').max(200),
  email: emailSchema,
  role: roleSchema,
  organisationId: z.number().int().positive().optional(),
})

export const updateUserSchema = z.object({
  role: roleSchema.optional(),
  active: z.boolean().optional(),
  organisationId: z.number().int().positive().nullable().optional(),
}).refine(v => v.role !== undefined || v.active !== undefined || v.organisationId !== undefined, 'Nothing to change')

export const createOrganisationSchema = z.object({
  name: z.string().trim().min(2, 'Enter the organisation name').max(200),
  kind: organisationKindSchema,
})

export const mergeOrganisationSchema = z.object({
  intoId: z.number().int().positive(),
})

export const idParamSchema = z.object({
  id: z.coerce.number().int().positive('Not a valid id'),
})
