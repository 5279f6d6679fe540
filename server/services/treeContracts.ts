import type { Knex } from 'knex'
import { BUYER_CANCEL_UNTIL, TREE_TERM_DEFAULTS, type TreeContractCreateInput, type TreeContractListQuery, type TreeDeliverInput, type TreeTerms, type TreeTermsPatch } from '#shared/schemas/contract'
import type { ContractHistory, TreeContract, TreeContractList } from '#shared/types/contract'
import { backPlanWarning, interstemProblem, nurseryBackPlan } from '#shared/utils/backplan'
import type { TreeContractAction, TreeContractSide } from '#shared/utils/contractStatus'
import { treeContractMoney } from '#shared/utils/treeContractMoney'
import { findParty, TREE_PARTIES, insertContractEvent } from '../repositories/contracts'
import { catalogueSpecies } from '../repositories/catalogue'
import { dugForContract } from '../repositories/nurseryRuns'
import { findTreeContract, insertTreeContract, listTreeContracts, TREE_TERM_KEYS, type TreeContractRow } from '../repositories/treeContracts'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type DbRefusals } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'
import { checkCatalogue } from './catalogue'
import { refundDepositAfterCancel } from './payments'
import {
  checkAcceptedVersion, checkExpiryAhead, dateOnly, historyFor, moveContract, movesFor, sideOf, termChanges, today,
  type ContractKindService, type Member, type MoveContext, type MoveEffect,
} from './contracts'

// Tree contracts: a buyer (a maker, or a grower planting an orchard) orders trees from a nursery.
// The negotiation is the shared one (services/contracts.ts); here are the terms, their checks,
// the money and back-plan a contract shows, and the nursery's own moves.

export const TREE_CONTRACTS: ContractKindService<TreeContractRow, TreeContractSide> = {
  parties: TREE_PARTIES,
  noun: 'tree contract',
  link: id => `/contracts/tree/${id}`,
  describe: async (trx, row) => {
    const [variety, rootstock] = await catalogueSpecies(trx, row.varietyId, row.rootstockId)
    return `${row.treeCount.toLocaleString('en-GB')} ${variety?.name ?? 'trees'} on ${rootstock?.designation ?? 'their rootstock'}`
  },
}

const REFUSALS: DbRefusals = {
  missingReference: { field: 'varietyId', message: 'The variety or rootstock is no longer in the catalogue' },
}

function termsOf(row: TreeContractRow): TreeTerms {
  const terms = Object.fromEntries(TREE_TERM_KEYS.map(k => [k, row[k]])) as unknown as TreeTerms
  return { ...terms, expiresOn: dateOnly(terms.expiresOn as string | null) }
}

function toContract(row: TreeContractRow, user: Member): TreeContract {
  const side = sideOf(TREE_PARTIES, row as unknown as Record<string, unknown>, user.orgId)
  const { moves, awaiting, expired } = movesFor('tree', user, side, row)
  const plan = nurseryBackPlan({
    deliveryYear: row.deliveryYear, season: row.deliverySeason, trees: row.treeCount, takeRate: row.takeRate, survivalRate: row.survivalRate,
    treeType: row.treeType, interstem: Boolean(row.interstem), hemisphere: row.nurseryHemisphere,
  })
  const notStarted = ['draft', 'offered', 'countered', 'accepted'].includes(row.state)
  const cancelledAfterAcceptance = row.state === 'cancelled' && row.acceptedVersion !== null ? row.cancelledBy : null
  const { expiryNoticedVersion: _n, createdByUserId: _c, nurseryHemisphere: _h, ...shown } = row
  return {
    ...shown,
    ...termsOf(row),
    deliveredOn: dateOnly(row.deliveredOn),
    createdAt: new Date(row.createdAt).toISOString(),
    updatedAt: new Date(row.updatedAt).toISOString(),
    side,
    moves: moves as TreeContract['moves'],
    awaiting,
    expired,
    money: treeContractMoney(row, { deliveredCount: row.state === 'delivered' ? row.deliveredCount : null, cancelledAfterAcceptanceBy: cancelledAfterAcceptance }),
    backPlan: { ...plan, warning: notStarted ? backPlanWarning(plan.steps, today()) : null },
  }
}

export async function getTreeContract(user: Member, id: number): Promise<TreeContract> {
  const row = await findTreeContract(useDb(), user.orgId, id)
  if (!row) notFound('That tree contract')
  return toContract(row, user)
}

export async function listTreeContractsFor(user: Member, query: TreeContractListQuery): Promise<TreeContractList> {
  const { rows, total } = await listTreeContracts(useDb(), user.orgId, query)
  return { items: rows.map(row => toContract(row, user)), total }
}

export async function treeContractHistory(user: Member, id: number, page: { limit: number, offset: number }): Promise<ContractHistory> {
  const row = await findTreeContract(useDb(), user.orgId, id)
  if (!row) notFound('That tree contract')
  return historyFor(TREE_PARTIES, user, row, page)
}

/** The variety, rootstock and a compatible species, checked on the terms as they will stand. */
async function checkTerms(trx: Knex.Transaction, terms: TreeTerms): Promise<void> {
  const problem = interstemProblem(terms.treeType, Boolean(terms.interstem))
  if (problem) throw fieldError([{ path: 'interstem', message: problem }])
  await checkCatalogue(trx, terms.varietyId, terms.rootstockId)
}

/** Which side the drafter is on, and the counterparty, from the two party ids the body gives. */
async function partiesOf(trx: Knex.Transaction, user: Member, input: TreeContractCreateInput) {
  const own = user.orgId
  const buyer = input.buyerOrgId ?? (input.nurseryOrgId !== undefined && input.nurseryOrgId !== own ? own : undefined)
  const nursery = input.nurseryOrgId ?? (input.buyerOrgId !== undefined && input.buyerOrgId !== own ? own : undefined)
  if (buyer === undefined || nursery === undefined) throw fieldError([{ path: 'nurseryOrgId', message: 'Choose the nursery you order from (or, as a nursery, the buyer)' }])
  if (buyer === nursery) throw fieldError([{ path: 'nurseryOrgId', message: 'The buyer and the nursery must be two organisations' }])
  if (buyer !== own && nursery !== own) throw fieldError([{ path: 'buyerOrgId', message: 'One of the two parties must be your own organisation' }])
  const side: TreeContractSide = buyer === own ? 'buyer' : 'nursery'
  const counterpartyId = side === 'buyer' ? nursery : buyer
  const [ownOrg, counterparty] = await Promise.all([findParty(trx, own), findParty(trx, counterpartyId)])
  const field = side === 'buyer' ? 'nurseryOrgId' : 'buyerOrgId'
  if (!counterparty || counterparty.status !== 'active') throw fieldError([{ path: field, message: 'No organisation with that id takes contracts' }])
  if (side === 'buyer' && !counterparty.isNursery) throw fieldError([{ path: 'nurseryOrgId', message: `${counterparty.name} does not run a nursery` }])
  if (side === 'nursery' && !ownOrg?.isNursery) throw fieldError([{ path: 'nurseryOrgId', message: 'Your organisation does not run a nursery' }])
  return { buyer, nursery, side, currency: ownOrg?.currency }
}

export function createTreeContract(user: Member, input: TreeContractCreateInput): Promise<number> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const { buyer, nursery, side, currency } = await partiesOf(trx, user, input)
    const { buyerOrgId: _b, nurseryOrgId: _n, ...given } = input
    const terms = { ...TREE_TERM_DEFAULTS, currency, ...Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined)) } as TreeTerms
    await checkTerms(trx, terms)
    const id = await insertTreeContract(trx, { ...terms, buyerOrgId: buyer, nurseryOrgId: nursery, draftedBy: side, state: 'draft', version: 0, createdByUserId: user.id })
    await insertContractEvent(trx, { contractKind: 'tree', contractId: id, action: 'created', version: 0, byUserId: user.id, byOrgId: user.orgId, byName: user.name, changes: [] })
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'tree_contract.created', objectType: 'tree_contract', objectId: id, detail: { buyerOrgId: buyer, nurseryOrgId: nursery } })
    return id
  }))
}

/** The terms a draft's edit or a counter-offer leaves standing, checked; and what changed. */
async function patched(ctx: MoveContext<TreeContractRow, TreeContractSide>, patch: TreeTermsPatch) {
  const before = termsOf(ctx.row)
  const after = { ...before, ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) } as TreeTerms
  const changes = termChanges(before, after)
  await checkTerms(ctx.trx, after)
  return { after, changes }
}

export function editTreeDraft(user: Member, id: number, patch: TreeTermsPatch): Promise<void> {
  return withDbRefusals(REFUSALS, () => moveContract(TREE_CONTRACTS, user, id, 'edit', async (ctx): Promise<MoveEffect> => {
    const { after, changes } = await patched(ctx, patch)
    return { columns: after, changes }
  }))
}

export type TreeMoveBody = { reason?: string | null } | TreeTermsPatch | { version: number } | TreeDeliverInput

// The order of the states after acceptance, for "the buyer may cancel until …".
const AFTER_ACCEPTANCE = BUYER_CANCEL_UNTIL

function checkCancel(row: TreeContractRow, side: TreeContractSide): void {
  if (side !== 'buyer') return
  const at = AFTER_ACCEPTANCE.indexOf(row.state as typeof AFTER_ACCEPTANCE[number])
  if (at > AFTER_ACCEPTANCE.indexOf(row.buyerMayCancelUntil)) {
    throw createError({
      statusCode: 409,
      message: `Under the terms the buyer may cancel only until the contract is ${row.buyerMayCancelUntil}; it is ${row.state} now.`,
      data: { state: row.state, version: row.version },
    })
  }
}

/** One move on a tree contract; the body has been validated by the route's schema for the action. */
export async function moveTreeContract(user: Member, id: number, action: Exclude<TreeContractAction, 'edit'>, body: TreeMoveBody): Promise<void> {
  await moveTreeContractTerms(user, id, action, body)
  // A cancellation whose terms return a paid deposit refunds it on the processor once it stands.
  if (action === 'cancel') await refundDepositAfterCancel(id)
}

function moveTreeContractTerms(user: Member, id: number, action: Exclude<TreeContractAction, 'edit'>, body: TreeMoveBody): Promise<void> {
  return withDbRefusals(REFUSALS, () => moveContract(TREE_CONTRACTS, user, id, action, async (ctx): Promise<MoveEffect> => {
    const { row, side } = ctx
    const reason = 'reason' in body ? body.reason ?? null : null
    switch (action) {
      case 'offer': {
        checkExpiryAhead(dateOnly(row.expiresOn))
        return { newVersion: true, terms: termsOf(row), reason }
      }
      case 'counter': {
        const { after, changes } = await patched(ctx, body as TreeTermsPatch)
        if (!changes.length) throw fieldError([{ path: Object.keys(body)[0] ?? 'unitPriceMinor', message: 'A counter-offer changes at least one term' }])
        checkExpiryAhead(after.expiresOn)
        return { newVersion: true, columns: after, changes, terms: after }
      }
      case 'accept':
        checkAcceptedVersion(row, (body as { version: number }).version)
        return { columns: { acceptedVersion: row.version } }
      case 'decline':
        return { reason }
      case 'cancel':
        if (row.state === 'accepted' || row.state === 'propagating' || row.state === 'ready') {
          checkCancel(row, side)
          return { columns: { cancelledBy: side }, reason }
        }
        return { reason }
      case 'deliver': {
        const { deliveredCount, deliveredOn } = body as TreeDeliverInput
        if (deliveredCount > row.treeCount) throw fieldError([{ path: 'deliveredCount', message: `The contract is for ${row.treeCount} trees: deliver at most that many` }])
        if (deliveredOn > today()) throw fieldError([{ path: 'deliveredOn', message: 'Record a delivery on or after the day it happens' }])
        // Trees are delivered from what the contract's runs have dug, never more.
        const dug = await dugForContract(ctx.trx, row.nurseryOrgId, row.id)
        if (deliveredCount > dug) throw fieldError([{ path: 'deliveredCount', message: `${dug.toLocaleString('en-GB')} trees have been dug from this contract's runs: deliver at most that many` }])
        return { columns: { deliveredCount, deliveredOn }, changes: [{ field: 'deliveredCount', from: null, to: deliveredCount }] }
      }
      default:
        return { reason }
    }
  }))
}
