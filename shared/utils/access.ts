import type { OrgKind, Role, SessionUser } from '../types/auth'

// Who may do what, decided once: the server's requireUser, the page guard, the navigation and the
// buttons on a page all ask decideAccess with these rules.

export interface AccessRule {
  /** Roles allowed; omitted means any signed-in role except the platform admin. */
  roles?: Role[]
  /** The organisation kind allowed; omitted means any. */
  orgKind?: OrgKind
  /** Only organisations that also run a nursery. */
  nursery?: boolean
}

export type AccessDecision = { ok: true } | { ok: false, statusCode: 401 | 403, message: string }

/** What a decision needs to know about the person; the session user carries it. */
export type AccessSubject = Pick<SessionUser, 'role' | 'orgKind' | 'isNursery'>

/** Every role inside an organisation: they may read its records. */
export const READERS: Role[] = ['owner', 'member', 'viewer']
/** Roles that may write an organisation's records. Viewers only read. */
export const WRITERS: Role[] = ['owner', 'member']
export const OWNERS: Role[] = ['owner']

/** Pure decision: who may call a route, open a page or press a button. Tenant data is never the admin's by default. */
export function decideAccess(user: AccessSubject | null, rule: AccessRule = {}): AccessDecision {
  if (!user) return { ok: false, statusCode: 401, message: 'Sign in to continue.' }
  const roles = rule.roles ?? READERS
  if (!roles.includes(user.role)) {
    return { ok: false, statusCode: 403, message: `Your role (${user.role}) cannot do this.` }
  }
  if (rule.orgKind && user.orgKind !== rule.orgKind) {
    return { ok: false, statusCode: 403, message: `Only ${rule.orgKind} organisations can do this.` }
  }
  if (rule.nursery && !user.isNursery) {
    return { ok: false, statusCode: 403, message: 'Only organisations that run a nursery can do this.' }
  }
  return { ok: true }
}

/** A table of named rules, its keys kept and every value an AccessRule. */
function ruleTable<K extends string>(table: Record<K, AccessRule>): Readonly<Record<K, AccessRule>> {
  return table
}

/** The rules pages and buttons name; each matches the routes behind it. */
export const ACCESS_RULES = ruleTable({
  /** Anyone signed in, the platform admin included. */
  signedIn: { roles: [...READERS, 'admin'] },
  platformAdmin: { roles: ['admin'] },
  /** Anyone inside an organisation: the platform admin has no records of its own. */
  organisation: { roles: READERS },
  readBlocks: { orgKind: 'grower', roles: READERS },
  writeBlocks: { orgKind: 'grower', roles: WRITERS },
  manageMembers: { roles: OWNERS },
  /** The organisation's settings: its people read them, its owners change them. */
  readSettings: { roles: READERS },
  editSettings: { roles: OWNERS },
  /** The directory of listed organisations. */
  directory: { roles: [...READERS, 'admin'] },
  /** A person's own notices: everyone inside an organisation. */
  notices: { roles: READERS },
  /** What the outbox sent in the organisation's name. */
  organisationOutbox: { roles: OWNERS },
  curateCatalogue: { roles: ['admin'] },
  /** Tree and fruit contracts: each is seen only by its two parties (the service checks which). */
  readContracts: { roles: READERS },
  /** Drafting and editing a draft, and the moves (the contract's own table then says who may make which). */
  writeContracts: { roles: WRITERS },
  /** A grower's forecast against its fruit contracts. */
  coverage: { orgKind: 'grower', roles: READERS },
  /** A maker's planned need of fruit against its contracted supply. */
  readNeeds: { orgKind: 'maker', roles: READERS },
  writeNeeds: { orgKind: 'maker', roles: WRITERS },
  /** The nursery's beds, stock, map and records: organisations that run a nursery. */
  readNursery: { nursery: true, roles: READERS },
  writeNursery: { nursery: true, roles: WRITERS },
  /** Harvest lots and their readings: a grower's own; a maker sees those its contracts cover (the service checks which). */
  readLots: { roles: READERS },
  writeLots: { orgKind: 'grower', roles: WRITERS },
  /** Lab and juice sheets: a grower uploads and imports; a maker may read a sheet whose every lot it may see. */
  readLabSheets: { roles: READERS },
  writeLabSheets: { orgKind: 'grower', roles: WRITERS },
  /** Deliveries and their statements: seen by the contract's two parties (the service checks which). */
  readDeliveries: { roles: READERS },
  /** A delivery is recorded, corrected and settled by the buying maker. */
  recordDeliveries: { orgKind: 'maker', roles: WRITERS },
  /** Either party may dispute a delivery; the side that disputed withdraws it. */
  disputeDeliveries: { roles: WRITERS },
  /** Payments: seen by their payer and payee (the service checks which). */
  readPayments: { roles: READERS },
  /** The paying party's owners pay; the payee's owners refund a deposit the terms return. */
  makePayments: { roles: OWNERS },
  refundPayments: { roles: OWNERS },
  /** A seller (a grower or nursery) connects the account it is paid into; its owners do. */
  connectPaymentAccount: { orgKind: 'grower', roles: OWNERS },
  /** The blend planner, a maker's saved juice targets, its blend plans and pressings: its owners and members plan and press, viewers read. */
  readBlends: { orgKind: 'maker', roles: READERS },
  writeBlends: { orgKind: 'maker', roles: WRITERS },
})

/**
 * Who may open each page, by its route path. A page names its own entry in `definePageMeta({ access })`
 * and the navigation links to it only for those who pass, so a page a person may not use is neither
 * linked nor reachable. A path not listed is open to visitors.
 */
export const PAGE_RULES = ruleTable({
  '/': ACCESS_RULES.signedIn,
  '/admin/organisations': ACCESS_RULES.platformAdmin,
  '/blends': ACCESS_RULES.readBlends,
  '/blends/plans': ACCESS_RULES.readBlends,
  '/blends/plans/:id': ACCESS_RULES.readBlends,
  '/blends/plans/:id/press-sheet': ACCESS_RULES.readBlends,
  '/blends/pressings/:id': ACCESS_RULES.readBlends,
  '/blocks': ACCESS_RULES.readBlocks,
  '/blocks/new': ACCESS_RULES.writeBlocks,
  '/blocks/:id': ACCESS_RULES.readBlocks,
  '/catalogue': ACCESS_RULES.signedIn,
  '/contracts': ACCESS_RULES.readContracts,
  '/contracts/tree/new': ACCESS_RULES.writeContracts,
  '/contracts/tree/:id': ACCESS_RULES.readContracts,
  '/contracts/fruit/new': ACCESS_RULES.writeContracts,
  '/contracts/fruit/:id': ACCESS_RULES.readContracts,
  '/coverage': ACCESS_RULES.coverage,
  '/needs': ACCESS_RULES.readNeeds,
  '/catalogue/rootstocks/new': ACCESS_RULES.curateCatalogue,
  '/catalogue/rootstocks/:id': ACCESS_RULES.signedIn,
  '/catalogue/varieties/new': ACCESS_RULES.curateCatalogue,
  '/catalogue/varieties/:id': ACCESS_RULES.signedIn,
  '/deliveries': ACCESS_RULES.readDeliveries,
  '/deliveries/new': ACCESS_RULES.recordDeliveries,
  '/deliveries/:id': ACCESS_RULES.readDeliveries,
  '/deliveries/:id/statement': ACCESS_RULES.readDeliveries,
  '/directory': ACCESS_RULES.directory,
  '/directory/:id': ACCESS_RULES.directory,
  '/juice': ACCESS_RULES.readLots,
  '/lab-sheets': ACCESS_RULES.readLabSheets,
  '/lab-sheets/:id': ACCESS_RULES.readLabSheets,
  '/lots': ACCESS_RULES.readLots,
  '/lots/new': ACCESS_RULES.writeLots,
  '/lots/:id': ACCESS_RULES.readLots,
  '/members': ACCESS_RULES.organisation,
  '/notices': ACCESS_RULES.notices,
  '/nursery': ACCESS_RULES.readNursery,
  '/nursery/beds': ACCESS_RULES.readNursery,
  '/nursery/beds/:id': ACCESS_RULES.readNursery,
  '/nursery/budwood': ACCESS_RULES.readNursery,
  '/nursery/budwood/:id': ACCESS_RULES.readNursery,
  '/nursery/dispatch/:id': ACCESS_RULES.readNursery,
  '/nursery/liners': ACCESS_RULES.readNursery,
  '/nursery/runs': ACCESS_RULES.readNursery,
  '/nursery/runs/new': ACCESS_RULES.writeNursery,
  '/nursery/runs/:id': ACCESS_RULES.readNursery,
  '/nursery/tags': ACCESS_RULES.readNursery,
  '/nursery/tasks': ACCESS_RULES.readNursery,
  '/nursery/t/:code': ACCESS_RULES.readNursery,
  '/payments': ACCESS_RULES.readPayments,
  '/payments/:id': ACCESS_RULES.readPayments,
  '/settings': ACCESS_RULES.readSettings,
  '/statements': ACCESS_RULES.readDeliveries,
  '/statements/:contractId/:year': ACCESS_RULES.readDeliveries,
})

export type PagePath = keyof typeof PAGE_RULES

/** Whether this person may open the page at `path` (a visitor may open any page without a rule). */
export function mayOpen(user: AccessSubject | null, path: string): boolean {
  const rule: AccessRule | undefined = (PAGE_RULES as Record<string, AccessRule>)[path]
  return !rule || decideAccess(user, rule).ok
}
