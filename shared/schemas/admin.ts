import { z } from 'zod'

// The platform admin opens or suspends an organisation; a suspended one's people are signed out.
export const ORGANISATION_STATUSES = ['active', 'suspended'] as const
export const organisationStatusSchema = z.object({
  status: z.enum(ORGANISATION_STATUSES, { message: 'Choose active or suspended' }),
})
