import type { OrgKind, Role } from '../types/auth'

export interface NavItem { to: string, label: string }

interface NavRule extends NavItem {
  kinds?: OrgKind[]
  roles?: Role[]
  nursery?: boolean
}

// What each person sees in the main navigation. The server checks every route again;
// this only keeps people from being shown what they may not use.
const NAV: NavRule[] = [
  { to: '/', label: 'Home' },
  { to: '/blocks', label: 'Orchard blocks', kinds: ['grower'] },
  { to: '/catalogue', label: 'Varieties & rootstocks' },
  { to: '/calculators', label: 'Calculators' },
  { to: '/members', label: 'Members', roles: ['owner', 'member', 'viewer'] },
  { to: '/admin/organisations', label: 'Organisations', roles: ['admin'] },
]

export function navigationFor(user: { orgKind: OrgKind | null, role: Role, isNursery: boolean } | null): NavItem[] {
  if (!user) return NAV.filter(item => item.to === '/calculators')
  return NAV
    .filter(item => !item.kinds || (user.orgKind !== null && item.kinds.includes(user.orgKind)))
    .filter(item => !item.roles || item.roles.includes(user.role))
    .filter(item => !item.nursery || user.isNursery)
    .map(({ to, label }) => ({ to, label }))
}
