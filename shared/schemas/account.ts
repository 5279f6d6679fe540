import { z } from 'zod'
import { MEMBER_ROLES, ORG_KINDS, UNIT_SYSTEMS } from '../types/auth'

export const MIN_PASSWORD_LENGTH = 10

export const emailField = z.string().trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address' })).pipe(z.string().max(254))
export const passwordField = z.string()
  .min(MIN_PASSWORD_LENGTH, { message: `Use at least ${MIN_PASSWORD_LENGTH} characters` })
  .max(200, { message: 'Use at most 200 characters' })
const personName = z.string().trim().min(1, { message: 'Enter a name' }).max(160)
const token = z.string().trim().min(20, { message: 'This link is incomplete' }).max(200)

export const signUpSchema = z.object({
  orgName: z.string().trim().min(2, { message: 'Enter the organisation name' }).max(160),
  orgKind: z.enum(ORG_KINDS, { message: 'Choose grower or maker' }),
  isNursery: z.boolean().default(false),
  region: z.string().trim().max(120).optional(),
  name: personName,
  email: emailField,
  password: passwordField,
}).refine(v => v.orgKind === 'grower' || !v.isNursery, { path: ['isNursery'], message: 'Only a grower organisation can also be a nursery' })
export type SignUpInput = z.infer<typeof signUpSchema>

export const tokenSchema = z.object({ token })

export const forgotPasswordSchema = z.object({ email: emailField })

export const resetPasswordSchema = z.object({ token, password: passwordField })

export const inviteSchema = z.object({
  email: emailField,
  role: z.enum(MEMBER_ROLES, { message: 'Choose owner, member or viewer' }),
})
export type InviteInput = z.infer<typeof inviteSchema>

export const acceptInvitationSchema = z.object({ token, name: personName, password: passwordField })

export const memberPatchSchema = z.object({ role: z.enum(MEMBER_ROLES, { message: 'Choose owner, member or viewer' }) })

export const profilePatchSchema = z.object({
  name: personName.optional(),
  units: z.enum(UNIT_SYSTEMS, { message: 'Choose metric or US customary' }).optional(),
}).refine(v => v.name !== undefined || v.units !== undefined, { message: 'Nothing to change', path: ['units'] })
