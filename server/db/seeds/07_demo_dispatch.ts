import type { Knex } from 'knex'
import { treeTermsFields, type TreeTerms } from '../../../shared/schemas/contract'
import type { DugGrade, LinerGrade, LossCause } from '../../../shared/schemas/nursery'
import { rootstocksToBud } from '../../../shared/utils/backplan'
import { checkContractMove, type TreeContractAction, type TreeContractSide, type TreeContractState } from '../../../shared/utils/contractStatus'
import type { MoveCheck } from '../../../shared/utils/stateMachine'
import { runCounts } from '../../../shared/utils/runCounts'
import { newTagCode } from '../../utils/tagCode'

// Trees ready to go: Tansy Row ordered 400 Stoke Red on M.26 from Hollowmere for spring 2027, to
// plant a new bittersharp block on the river flats. The liners were bought in and lined out in
// row 14 in April 2025, budded that August, headed back in March 2026 and dug in November 2026 in
// three grades; the contract is ready, so the dispatch labels have bundles to print on first start.
//
// The cycle (R. Crassweller, Penn State, eXtension "Nursery Production of Finished Apple Trees"):
// lined out in early spring, budded in late summer about 15 cm up, headed back the next spring
// while dormant, one shoot grown, dug in November and sold the following spring. A standard
// finished tree has at least 12.7 mm caliper above the union (the same source); the contract asks
// 12 mm, so the thinnest grade falls under it. Written once; seeds run through the database edge
// (camelCase both ways).

const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
const TANSY_ROW = 'Tansy Row Fruit'
const FIELD = 'Nursery Field'
const INES = 'grower@demo.test'
const TOMAS = 'grower-member@demo.test'
const PRIYA = 'grower2@demo.test'
type Person = typeof INES | typeof TOMAS | typeof PRIYA

/** The contract's terms, the catalogue by name. */
export const DISPATCH_CONTRACT = {
  variety: 'Stoke Red', rootstock: 'M.26',
  terms: {
    interstem: null, treeCount: 400, treeType: 'maiden', minCaliperMm: 12, deliveryYear: 2027, deliverySeason: 'spring', currency: 'GBP',
    unitPriceMinor: 1250, royaltyPerTreeMinor: 0, depositPct: 20, depositIfBuyerCancels: 'kept', depositIfNurseryCancels: 'refunded',
    buyerMayCancelUntil: 'accepted', certificateRequired: true, takeRate: 0.85, survivalRate: 0.9,
    plantingSite: 'Long Acre, Tansy Row Fruit (new block)',
    notes: 'Long Acre: bittersharp on dwarfing stock like the rest of the river flats, planted bare-root in March.',
    expiresOn: null,
  },
} as const

interface DemoMove { action: TreeContractAction, history: string, at: string, by: Person, reason: string | null }

// Drafted by the buyer, offered, accepted on the first offer, then the nursery's own work.
const MOVES: DemoMove[] = [
  { action: 'offer', history: 'offered', at: '2025-01-21T09:30:00Z', by: PRIYA, reason: null },
  { action: 'accept', history: 'accepted', at: '2025-02-03T14:10:00Z', by: INES, reason: null },
  { action: 'start-propagation', history: 'propagation-started', at: '2025-08-22T16:30:00Z', by: INES, reason: 'Budded on 20 August in row 14 with bought-in Stoke Red wood.' },
  { action: 'mark-ready', history: 'marked-ready', at: '2026-11-20T15:00:00Z', by: INES, reason: 'Dug on 16 November: 447 trees in three grades, heeled in for spring.' },
]
const CREATED_AT = '2025-01-20T11:00:00Z'
const SIDE_OF: Record<Person, TreeContractSide> = { [PRIYA]: 'buyer', [INES]: 'nursery', [TOMAS]: 'nursery' }

const LINERS = {
  grade: '7-10mm' as LinerGrade, receivedOn: '2025-02-25', supplier: 'Greyling Rootstocks, Estry Marsh',
  certificate: 'UK plant passport GB-52841, lot GRS-2502-044', notes: 'M.26 for Tansy Row\'s Stoke Red, lined out in April.',
}

const BUDWOOD = {
  label: 'HM-BW-25-01', variety: 'Stoke Red', cutOn: '2025-08-19', sourceKind: 'bought', supplier: 'Coldharbour Fruit Trees, Upper Estry',
  certificate: 'UK plant passport GB-47306, lot CFT-25-0819', sticks: 60,
  notes: 'Pencil-thick current-season shoots, leaf blades clipped; kept cool and damp overnight.',
} as const

/** The three grades dug, thickest first: 212 + 198 + 37 = 447 trees. */
export const DISPATCH_GRADES: DugGrade[] = [
  { caliperMm: 16, heightCm: 160, feathered: true, count: 212 },
  { caliperMm: 13, heightCm: 140, feathered: false, count: 198 },
  { caliperMm: 10, heightCm: 110, feathered: false, count: 37 },
]

interface DemoEvent { kind: string, on: string, count?: number, cause?: LossCause, passNo?: number, grades?: DugGrade[], notes?: string, by: Person }

/** One liner to a position, as many as the back-plan asks for: ⌈400 / (0.85 × 0.9)⌉ = 523. */
export const DISPATCH_RUN = {
  row: '14', from: 1, to: 523, linedOutOn: '2025-04-10', tagPrintedOn: '2025-04-15',
  events: [
    { kind: 'loss', on: '2025-06-05', count: 3, cause: 'other', notes: 'Never broke bud after lining out.', by: TOMAS },
    { kind: 'shoots-removed', on: '2025-07-18', passNo: 1, notes: 'Side shoots rubbed off the lowest 25 cm, a clean stem to bud on.', by: TOMAS },
    { kind: 'budded', on: '2025-08-20', count: 520, by: TOMAS },
    { kind: 'take-counted', on: '2025-09-17', count: 461, notes: 'Chips green and the leaf stalks dropping at a touch.', by: INES },
    { kind: 'headed-back', on: '2026-03-04', notes: 'Cut back to just above the bud while dormant.', by: TOMAS },
    { kind: 'shoots-removed', on: '2026-05-12', passNo: 2, notes: 'Rootstock shoots off; one shoot left to grow from the bud.', by: TOMAS },
    { kind: 'loss', on: '2026-07-02', count: 6, cause: 'breakage', notes: 'Young shoots snapped at the union in the gale of 1 July.', by: TOMAS },
    { kind: 'loss', on: '2026-11-16', count: 8, cause: 'other', notes: 'Culled at lifting: crooked stems or torn roots.', by: INES },
    { kind: 'dug', on: '2026-11-16', grades: DISPATCH_GRADES, notes: 'Lifted, graded by caliper and heeled in under the barn for spring.', by: INES },
  ] satisfies DemoEvent[] as DemoEvent[],
}

/** A day at a working hour, as the timestamp of what was done that day. */
const on = (day: string, hour = 9) => new Date(`${day}T${String(hour).padStart(2, '0')}:00:00Z`)

interface Staff { id: number, name: string, orgId: number }

async function idOf(knex: Knex, table: string, where: Record<string, unknown>): Promise<number | undefined> {
  const row = await knex(table).where(where).first('id') as { id: number } | undefined
  return row?.id
}

/** The moves as the app's move table allows them, each on the day it was made; the state after. */
function replayMoves(): TreeContractState {
  let state: TreeContractState = 'draft'
  for (const move of MOVES) {
    const side = SIDE_OF[move.by]
    const checked: MoveCheck<TreeContractState> = checkContractMove('tree', move.action, { state, expiresOn: null }, { role: 'owner', side, draftedBy: 'buyer', lastOfferBy: state === 'draft' ? null : 'buyer' }, move.at.slice(0, 10))
    if (!checked.ok) throw new Error(`Demo dispatch: ${move.action} on ${move.at}: ${checked.message}`)
    state = checked.to
  }
  return state
}

/** The run's counts from its events: a count that does not add up stops the seed. */
function checkRun(): void {
  const linedOut = DISPATCH_RUN.to - DISPATCH_RUN.from + 1
  if (linedOut !== rootstocksToBud(DISPATCH_CONTRACT.terms.treeCount, DISPATCH_CONTRACT.terms.takeRate, DISPATCH_CONTRACT.terms.survivalRate)) {
    throw new Error('Demo dispatch: the run does not line out what the back-plan asks for')
  }
  const counts = runCounts(linedOut, DISPATCH_RUN.events.map((e, i) => ({ kind: e.kind, happenedOn: e.on, id: i, count: e.count ?? null, cause: e.cause ?? null, grades: e.grades ?? null })))
  if (counts.standing !== 0 || counts.dug < DISPATCH_CONTRACT.terms.treeCount) throw new Error('Demo dispatch: the dig should leave the row empty and cover the contract')
}

export async function seed(knex: Knex): Promise<void> {
  const nursery = await idOf(knex, 'organisations', { name: HOLLOWMERE })
  const buyer = await idOf(knex, 'organisations', { name: TANSY_ROW })
  const varietyId = await idOf(knex, 'varieties', { name: DISPATCH_CONTRACT.variety })
  const rootstockId = await idOf(knex, 'rootstocks', { designation: DISPATCH_CONTRACT.rootstock })
  if (!nursery || !buyer || !varietyId || !rootstockId) {
    console.warn('Demo dispatch skipped: Hollowmere, Tansy Row or the catalogue is not there (seed the demo accounts and catalogue first).')
    return
  }
  const { terms } = DISPATCH_CONTRACT
  if (await idOf(knex, 'treeContracts', { buyerOrgId: buyer, nurseryOrgId: nursery, varietyId, rootstockId, deliveryYear: terms.deliveryYear })) return
  const field = await idOf(knex, 'nurseryBeds', { orgId: nursery, name: FIELD, kind: 'field' })
  const rowId = field && await idOf(knex, 'nurseryRows', { orgId: nursery, fieldId: field, name: DISPATCH_RUN.row })
  if (!rowId) {
    console.warn('Demo dispatch skipped: Hollowmere\'s nursery field has no row 14 (seed the demo nursery first).')
    return
  }
  const taken = await knex('nurseryRuns').where({ orgId: nursery, rowId }).andWhere('fromPosition', '<=', DISPATCH_RUN.to).andWhere('toPosition', '>=', DISPATCH_RUN.from).first('id')
  if (taken) {
    console.warn('Demo dispatch skipped: row 14 already holds a run.')
    return
  }
  const users = await knex('users').whereIn('email', [INES, TOMAS, PRIYA]).select('id', 'email', 'name', 'orgId') as (Staff & { email: Person })[]
  if (users.length < 3) {
    console.warn('Demo dispatch skipped: the demo people are not all there.')
    return
  }
  const people = Object.fromEntries(users.map(u => [u.email, u])) as unknown as Record<Person, Staff>
  const state = replayMoves()
  checkRun()

  await knex.transaction(async (trx) => {
    const contractTerms: TreeTerms = { ...terms, varietyId, rootstockId }
    const snapshot = Object.fromEntries(Object.keys(treeTermsFields).map(k => [k, contractTerms[k as keyof TreeTerms]]))
    const [contractId] = await trx('treeContracts').insert({
      ...snapshot, buyerOrgId: buyer, nurseryOrgId: nursery, draftedBy: 'buyer', lastOfferBy: 'buyer', state, version: 1, acceptedVersion: 1,
      createdByUserId: people[PRIYA].id, createdAt: new Date(CREATED_AT), updatedAt: new Date(MOVES.at(-1)!.at),
    })
    const history = [{ history: 'created', at: CREATED_AT, by: PRIYA as Person, reason: null as string | null, version: 0 }, ...MOVES.map(m => ({ ...m, version: 1 }))]
    for (const entry of history) {
      const person = people[entry.by]
      await trx('contractEvents').insert({
        contractKind: 'tree', contractId, action: entry.history, version: entry.version, byUserId: person.id, byOrgId: person.orgId, byName: person.name,
        changes: JSON.stringify([]), terms: entry.history === 'offered' ? JSON.stringify(snapshot) : null, reason: entry.reason, at: new Date(entry.at),
      })
    }

    const linedOutCount = DISPATCH_RUN.to - DISPATCH_RUN.from + 1
    // Bought in for this run: Hollowmere's own stool beds grow MM.106 and M.9.
    await trx('linerLots').insert({ ...LINERS, orgId: nursery, rootstockId, source: 'bought', count: linedOutCount, createdAt: on(LINERS.receivedOn, 14) })
    const { variety: _v, ...budwood } = BUDWOOD
    const [budwoodLotId] = await trx('budwoodLots').insert({ ...budwood, orgId: nursery, varietyId, blockId: null, sourceNote: null, createdAt: on(BUDWOOD.cutOn, 18) })
    const [runId] = await trx('nurseryRuns').insert({
      orgId: nursery, rowId, fromPosition: DISPATCH_RUN.from, toPosition: DISPATCH_RUN.to, rootstockId, linerGrade: LINERS.grade,
      linedOutOn: DISPATCH_RUN.linedOutOn, linedOutCount, varietyId, treeContractId: contractId,
      tagCode: newTagCode(), tagPrintedAt: on(DISPATCH_RUN.tagPrintedOn, 11), identityChangedAt: on(DISPATCH_RUN.linedOutOn, 16),
      notes: 'Grown for Tansy Row\'s Long Acre.', createdAt: on(DISPATCH_RUN.linedOutOn, 16), updatedAt: on(DISPATCH_RUN.events.at(-1)!.on, 16),
    })
    const tomas = people[TOMAS]
    await trx('propagationEvents').insert({ orgId: nursery, runId, kind: 'lined-out', happenedOn: DISPATCH_RUN.linedOutOn, count: linedOutCount, byUserId: tomas.id, byName: tomas.name, createdAt: on(DISPATCH_RUN.linedOutOn, 16) })
    for (const { on: day, by, grades, ...event } of DISPATCH_RUN.events) {
      const budded = event.kind === 'budded'
      await trx('propagationEvents').insert({
        ...event, orgId: nursery, runId, happenedOn: day,
        method: budded ? 'chip-bud' : null, budHeightCm: budded ? 15 : null, varietyId: budded ? varietyId : null,
        budwoodLotId: budded ? budwoodLotId : null, dayOrder: budded ? 1 : null, grades: grades ? JSON.stringify(grades) : null,
        byUserId: people[by].id, byName: people[by].name, createdAt: on(day, 17),
      })
    }
  })
}
