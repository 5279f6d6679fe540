import type { Knex } from 'knex'
import { fruitTermsFields, treeTermsFields, type FruitTerms, type TreeTerms } from '../../../shared/schemas/contract'
import { checkContractMove, type FruitContractAction, type FruitContractSide, type FruitContractState, type PartyActor, type TreeContractAction, type TreeContractSide, type TreeContractState } from '../../../shared/utils/contractStatus'
import type { MoveCheck } from '../../../shared/utils/stateMachine'
import { DEMO_OWNERS, FRUIT_CONTRACT, HOLLOWMERE, NOTICED_MOVES, QUILLHURST, QUILLHURST_NEEDS, TANSY_ROW, TREE_CONTRACTS, YOUNG_BLOCKS, type DemoMove } from './data/demoContracts'

// The demo's contracts: Quillhurst's three tree contracts with Hollowmere (two accepted, one
// countered on price), its bittersharp fruit contract with Tansy Row (2026–2030, over Tansy Row's
// forecast in 2027), Quillhurst's fruit needs, and the young blocks that make the forecasts climb.
// Each contract's moves are replayed through the app's move table, so its state, version and
// history agree with one another. Seeds run through the database edge: camelCase both ways.

type Side = string
type NoticedMove = typeof NOTICED_MOVES[number]
type Check = (action: string, state: string, expiresOn: string | null, actor: PartyActor<Side>, today: string) => MoveCheck<string>

interface Owner { id: number, name: string, orgId: number }

interface HistoryEntry { action: string, version: number, side: Side, changes: { field: string, from: unknown, to: unknown }[], terms: object | null, reason: string | null, at: string }

interface Replayed<T> { state: string, version: number, acceptedVersion: number | null, lastOfferBy: Side | null, terms: T, history: HistoryEntry[] }

// The history's word for a move, and the move table's.
const MOVE_OF: Record<DemoMove<unknown>['action'], string> = { 'offered': 'offer', 'countered': 'counter', 'accepted': 'accept', 'propagation-started': 'start-propagation' }

/** The terms as the API and the history show them: the schema's keys, in its order. */
function termsSnapshot<T extends object>(fields: object, terms: T): T {
  return Object.fromEntries(Object.keys(fields).map(key => [key, terms[key as keyof T]])) as T
}

/** The contract after its moves, each checked as the service would check it on the day it was made. */
function replay<T extends { expiresOn: string | null }>(
  draft: { draftedBy: Side, createdAt: string, terms: T, moves: DemoMove<T>[] },
  sides: readonly [Side, Side],
  fields: object,
  check: Check,
): Replayed<T> {
  const other = (side: Side) => (side === sides[0] ? sides[1] : sides[0])
  let { terms } = draft
  let state = 'draft'
  let version = 0
  let acceptedVersion: number | null = null
  let lastOfferBy: Side | null = null
  const history: HistoryEntry[] = [{ action: 'created', version: 0, side: draft.draftedBy, changes: [], terms: null, reason: null, at: draft.createdAt }]
  for (const move of draft.moves) {
    const side: Side = move.action === 'offered' ? draft.draftedBy : 'by' in move ? move.by : other(lastOfferBy ?? draft.draftedBy)
    const checked = check(MOVE_OF[move.action], state, terms.expiresOn, { role: 'owner', side, draftedBy: draft.draftedBy, lastOfferBy }, move.at.slice(0, 10))
    if (!checked.ok) throw new Error(`Demo contracts: ${move.action} on ${move.at}: ${checked.message}`)
    state = checked.to
    let changes: HistoryEntry['changes'] = []
    if (move.action === 'countered') {
      changes = Object.entries(move.change)
        .filter(([field, to]) => terms[field as keyof T] !== to)
        .map(([field, to]) => ({ field, from: terms[field as keyof T], to }))
      terms = { ...terms, ...move.change }
    }
    const offer = move.action === 'offered' || move.action === 'countered'
    if (offer) {
      version += 1
      lastOfferBy = side
    }
    if (move.action === 'accepted') acceptedVersion = version
    history.push({
      action: move.action, version, side, changes,
      terms: offer ? termsSnapshot(fields, terms) : null,
      reason: 'reason' in move ? move.reason : null,
      at: move.at,
    })
  }
  return { state, version, acceptedVersion, lastOfferBy, terms: termsSnapshot(fields, terms), history }
}

// One replay serves both kinds; these hand each kind's own table its own states and sides.
const treeCheck: Check = (action, state, expiresOn, actor, today) =>
  checkContractMove('tree', action as TreeContractAction, { state: state as TreeContractState, expiresOn }, actor as PartyActor<TreeContractSide>, today)
const fruitCheck: Check = (action, state, expiresOn, actor, today) =>
  checkContractMove('fruit', action as FruitContractAction, { state: state as FruitContractState, expiresOn }, actor as PartyActor<FruitContractSide>, today)

async function idsByName(knex: Knex, table: string, column: string, names: string[]): Promise<Map<string, number>> {
  const rows = await knex(table).whereIn(column, [...new Set(names)]).select('id', column) as Record<string, string | number>[]
  return new Map(rows.map(r => [String(r[column]), Number(r.id)]))
}

function lookup<K>(map: Map<K, number>, key: K, what: string): number {
  const id = map.get(key)
  if (id === undefined) throw new Error(`Demo contracts: no ${what} named "${String(key)}"`)
  return id
}

async function writeHistory(trx: Knex.Transaction, kind: 'tree' | 'fruit', contractId: number, history: HistoryEntry[], ownerOf: (side: Side) => Owner) {
  for (const entry of history) {
    const owner = ownerOf(entry.side)
    await trx('contractEvents').insert({
      contractKind: kind, contractId, action: entry.action, version: entry.version,
      byUserId: owner.id, byOrgId: owner.orgId, byName: owner.name,
      changes: JSON.stringify(entry.changes), terms: entry.terms === null ? null : JSON.stringify(entry.terms),
      reason: entry.reason, at: new Date(entry.at),
    })
  }
}

// What the contract service says of a move to the other side (services/contracts.ts).
const NOTICE_VERB: Record<NoticedMove['action'], string> = { offered: 'sent you an offer', countered: 'made a counter-offer', accepted: 'accepted' }

/**
 * The notices a move sent: to the other side's owners and members, in the app and by e-mail (sent
 * long since, like 04_demo_notices.ts's).
 */
async function writeNotice(trx: Knex.Transaction, move: { what: string, entry: HistoryEntry, by: Owner, byOrg: string, toOrgId: number, link: string, read: boolean }) {
  const { entry, by, byOrg, what } = move
  const offer = entry.action !== 'accepted'
  const verb = NOTICE_VERB[entry.action as NoticedMove['action']]
  const subject = `${byOrg} ${verb} ${offer ? `for ${what}` : `the tree contract for ${what}`}`
  const body = `${by.name} of ${byOrg} ${verb} ${offer ? 'for' : 'the tree contract for'} ${what} (version ${entry.version}).${entry.reason ? `\n\nTheir note: ${entry.reason}` : ''}`
  const kind = `tree_contract.${entry.action}`
  const at = new Date(entry.at)
  const people = await trx('users').where({ orgId: move.toOrgId, active: true }).whereIn('role', ['owner', 'member']).select('id', 'email') as { id: number, email: string }[]
  for (const person of people) {
    await trx('notices').insert({ userId: person.id, orgId: move.toOrgId, kind, subject, body, link: move.link, readAt: move.read ? at : null, createdAt: at })
    await trx('notifications').insert({
      orgId: move.toOrgId, userId: person.id, recipient: person.email, kind, subject, body, link: move.link,
      status: 'sent', attempts: 1, nextAttemptAt: at, sentAt: at, createdAt: at,
    })
  }
}

/** The ids the inserts look names up in, and the owner who speaks for each organisation. */
interface Demo {
  orgs: Map<string, number>
  varieties: Map<string, number>
  rootstocks: Map<string, number>
  ownerOfOrg: (org: string) => Owner
}

async function insertYoungBlocks(trx: Knex.Transaction, demo: Demo) {
  // Seed 03 fills an empty table only; these blocks join whatever is there, once each.
  for (const { org, variety, rootstock, ...block } of YOUNG_BLOCKS) {
    const orgId = lookup(demo.orgs, org, 'organisation')
    if (await trx('orchardBlocks').where({ orgId, name: block.name }).first('id')) continue
    await trx('orchardBlocks').insert({ ...block, orgId, varietyId: lookup(demo.varieties, variety, 'variety'), rootstockId: lookup(demo.rootstocks, rootstock, 'rootstock') })
  }
}

/** The tree contracts and their histories, and the notices of the moves the demo shows. */
async function insertTreeContracts(trx: Knex.Transaction, demo: Demo) {
  for (const contract of TREE_CONTRACTS) {
    const { variety, rootstock, ...terms } = contract.terms
    const withIds: TreeTerms = { ...terms, varietyId: lookup(demo.varieties, variety, 'variety'), rootstockId: lookup(demo.rootstocks, rootstock, 'rootstock') }
    const done = replay({ ...contract, terms: withIds }, ['buyer', 'nursery'], treeTermsFields, treeCheck)
    const parties: Record<string, string> = { buyer: contract.buyer, nursery: contract.nursery }
    const [id] = await trx('treeContracts').insert({
      buyerOrgId: lookup(demo.orgs, contract.buyer, 'organisation'), nurseryOrgId: lookup(demo.orgs, contract.nursery, 'organisation'),
      draftedBy: contract.draftedBy, lastOfferBy: done.lastOfferBy, state: done.state, version: done.version, acceptedVersion: done.acceptedVersion,
      ...done.terms,
      createdByUserId: demo.ownerOfOrg(parties[contract.draftedBy]!).id, createdAt: new Date(contract.createdAt), updatedAt: new Date(done.history.at(-1)!.at),
    })
    await writeHistory(trx, 'tree', id!, done.history, side => demo.ownerOfOrg(parties[side]!))
    const what = `${contract.terms.treeCount.toLocaleString('en-GB')} ${variety} on ${rootstock}`
    for (const noticed of NOTICED_MOVES.filter(n => n.variety === variety)) {
      const entry = done.history.find(e => e.action === noticed.action)
      if (!entry) throw new Error(`Demo contracts: the ${variety} contract was never ${noticed.action}`)
      const byOrg = parties[entry.side]!
      const toOrg = parties[entry.side === 'buyer' ? 'nursery' : 'buyer']!
      await writeNotice(trx, { what, entry, by: demo.ownerOfOrg(byOrg), byOrg, toOrgId: lookup(demo.orgs, toOrg, 'organisation'), link: `/contracts/tree/${id}`, read: noticed.read })
    }
  }
}

async function insertFruitContract(trx: Knex.Transaction, demo: Demo) {
  const contract = FRUIT_CONTRACT
  const done = replay<FruitTerms>(contract, ['maker', 'grower'], fruitTermsFields, fruitCheck)
  const parties: Record<string, string> = { maker: contract.maker, grower: contract.grower }
  const { schedule, ...terms } = done.terms
  const [id] = await trx('fruitContracts').insert({
    makerOrgId: lookup(demo.orgs, contract.maker, 'organisation'), growerOrgId: lookup(demo.orgs, contract.grower, 'organisation'),
    draftedBy: contract.draftedBy, lastOfferBy: done.lastOfferBy, state: done.state, version: done.version, acceptedVersion: done.acceptedVersion,
    ...terms,
    createdByUserId: demo.ownerOfOrg(parties[contract.draftedBy]!).id, createdAt: new Date(contract.createdAt), updatedAt: new Date(done.history.at(-1)!.at),
  })
  await trx('fruitContractYears').insert(schedule.map(y => ({ contractId: id, harvestYear: y.year, tonnes: y.tonnes, windowFrom: y.windowFrom, windowTo: y.windowTo })))
  await writeHistory(trx, 'fruit', id!, done.history, side => demo.ownerOfOrg(parties[side]!))
}

async function insertNeeds(trx: Knex.Transaction, demo: Demo) {
  const orgId = lookup(demo.orgs, QUILLHURST, 'organisation')
  if (await trx('makerNeeds').where({ orgId }).first('harvestYear')) return
  await trx('makerNeeds').insert(QUILLHURST_NEEDS.map(n => ({ orgId, juiceClass: n.juiceClass, harvestYear: n.year, kg: n.kg })))
}

export async function seed(knex: Knex): Promise<void> {
  const [{ count }] = await knex('treeContracts').count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return
  const [{ catalogue }] = await knex('varieties').count({ catalogue: '*' }) as [{ catalogue: number }]
  if (Number(catalogue) === 0) {
    console.warn('Demo contracts skipped: the variety catalogue is empty (seed it first).')
    return
  }
  const orgs = await idsByName(knex, 'organisations', 'name', [QUILLHURST, HOLLOWMERE, TANSY_ROW])
  // Seeds read rows through the database edge, so in camelCase.
  const users = await knex('users').whereIn('email', Object.values(DEMO_OWNERS)).select('id', 'email', 'name', 'orgId') as (Owner & { email: string })[]
  if (orgs.size < 3 || users.length < Object.keys(DEMO_OWNERS).length) {
    console.warn('Demo contracts skipped: the demo organisations and their owners are not all there (seed the demo accounts first).')
    return
  }
  const owners = new Map(users.map(u => [u.email, u]))
  const trees = TREE_CONTRACTS.map(c => c.terms)
  const demo: Demo = {
    orgs,
    varieties: await idsByName(knex, 'varieties', 'name', [...YOUNG_BLOCKS.map(b => b.variety), ...trees.map(t => t.variety)]),
    rootstocks: await idsByName(knex, 'rootstocks', 'designation', [...YOUNG_BLOCKS.map(b => b.rootstock), ...trees.map(t => t.rootstock)]),
    ownerOfOrg: org => owners.get(DEMO_OWNERS[org]!)!,
  }

  await knex.transaction(async (trx) => {
    await insertYoungBlocks(trx, demo)
    await insertTreeContracts(trx, demo)
    await insertFruitContract(trx, demo)
    await insertNeeds(trx, demo)
  })
}
