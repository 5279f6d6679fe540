import { mayOpen, type AccessSubject } from './access'

export interface NavItem { to: string, label: string }

// The main navigation. Each link is shown only to those who may open its page, by the page's own
// rule in PAGE_RULES; the server checks every route again.
export const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Home' },
  { to: '/blocks', label: 'Orchard blocks' },
  { to: '/lots', label: 'Lots' },
  { to: '/blends', label: 'Blends' },
  { to: '/contracts', label: 'Contracts' },
  { to: '/deliveries', label: 'Deliveries' },
  { to: '/payments', label: 'Payments' },
  { to: '/coverage', label: 'Coverage' },
  { to: '/needs', label: 'Fruit needs' },
  { to: '/nursery', label: 'Nursery' },
  { to: '/catalogue', label: 'Varieties & rootstocks' },
  { to: '/directory', label: 'Directory' },
  { to: '/calculators', label: 'Calculators' },
  { to: '/members', label: 'Members' },
  { to: '/settings', label: 'Settings' },
  { to: '/admin/organisations', label: 'Organisations' },
]

export function navigationFor(user: AccessSubject | null): NavItem[] {
  return NAV_ITEMS.filter(item => mayOpen(user, item.to)).map(({ to, label }) => ({ to, label }))
}
