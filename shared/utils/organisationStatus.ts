import type { Role } from '../types/auth'
import type { MoveTable } from './stateMachine'

// An organisation is `pending` from sign-up until its owner confirms the e-mailed link; the
// platform admin may open it without that check, suspend an active one (its people are signed
// out at once) and reopen a suspended one.
export const ORGANISATION_STATES = ['pending', 'active', 'suspended'] as const
export type OrganisationState = typeof ORGANISATION_STATES[number]
export type OrganisationAction = 'confirm' | 'open' | 'suspend' | 'reopen'

/** Who moves an organisation: a platform admin, or the owner following the confirmation link. */
export interface OrganisationActor { role: Role | 'confirming-owner' }

const isAdmin = (a: OrganisationActor) => a.role === 'admin'

export const ORGANISATION_MOVES: MoveTable<OrganisationState, OrganisationAction, OrganisationActor> = [
  { action: 'confirm', from: ['pending'], to: 'active', label: 'Confirm e-mail', allowed: a => a.role === 'confirming-owner' },
  { action: 'open', from: ['pending'], to: 'active', label: 'Open without e-mail check', allowed: isAdmin },
  { action: 'suspend', from: ['active'], to: 'suspended', label: 'Suspend', allowed: isAdmin },
  { action: 'reopen', from: ['suspended'], to: 'active', label: 'Reopen', allowed: isAdmin },
]
