export const ORG_KINDS = ['grower', 'maker'] as const
export type OrgKind = typeof ORG_KINDS[number]

export const MEMBER_ROLES = ['owner', 'member', 'viewer'] as const
export type MemberRole = typeof MEMBER_ROLES[number]
export type Role = MemberRole | 'admin'

export const UNIT_SYSTEMS = ['metric', 'us'] as const
export type UnitSystem = typeof UNIT_SYSTEMS[number]

/** Who is signed in, as the server checks it on every request (and as the session carries it). */
export interface SessionUser {
  id: number
  email: string
  name: string
  orgId: number | null
  orgKind: OrgKind | null
  isNursery: boolean
  role: Role
  units: UnitSystem
}
