import type { Knex } from 'knex'
import { FRUIT_TERM_DEFAULTS, fruitTermsIssues, type FruitContractCreateInput, type FruitContractListQuery, type FruitTerms, type FruitTermsPatch, type ScheduleYearInput } from '#shared/schemas/contract'
import type { ContractHistory, FruitContract, FruitContractList } from '#shared/types/contract'
import type { FruitContractAction, FruitContractSide } from '#shared/utils/contractStatus'
import { forecastClassOf } from '#shared/utils/forecast'
import type { JuiceClass } from '#shared/utils/juiceClass'
import { settlementExamples } from '#shared/utils/settlement'
import { findParty, FRUIT_PARTIES, insertContractEvent } from '../repositories/contracts'
import { findFruitContract, FRUIT_TERM_KEYS, insertFruitContract, listFruitContracts, schedulesOf, windowsClosed, writeSchedule, type FruitContractRow } from '../repositories/fruitContracts'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type DbRefusals } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'
import {
  checkAcceptedVersion, checkExpiryAhead, dateOnly, historyFor, moveContract, movesFor, sideOf, systemEvent, termChanges, today,
  type ContractKindService, type ContractRowBase, type Member, type MoveContext, type MoveEffect,
} from './contracts'
import { offerCoverageWarning } from './coverage'

// Fruit contracts: a maker buys a grower's fruit by juice class (or one variety), a schedule of
// tonnes per harvest year, priced per tonne with a sugar bonus and deduction. The negotiation is
// the shared one; a contract is fulfilled by Pomewright once its last delivery window has closed.

const tonnes = (n: number) => `${Number(n.toFixed(3)).toLocaleString('en-GB')} t`

function fruitWords(row: Pick<FruitContractRow, 'varietyName' | 'species' | 'juiceClass'>): string {
  if (row.varietyName) return row.varietyName
  return row.species === 'pear' ? `${row.juiceClass} perry pears` : `${row.juiceClass} fruit`
}

export const FRUIT_CONTRACTS: ContractKindService<FruitContractRow, FruitContractSide> = {
  parties: FRUIT_PARTIES,
  noun: 'fruit contract',
  link: id => `/contracts/fruit/${id}`,
  describe: async (trx, row) => {
    const schedule = (await schedulesOf(trx, [row.id])).get(row.id) ?? []
    const years = schedule.map(y => y.year)
    const span = years.length ? (years.length > 1 ? `${years[0]}–${years.at(-1)}` : `${years[0]}`) : ''
    const variety = row.varietyId ? await trx('varieties').where({ id: row.varietyId }).first('name') as { name: string } | undefined : undefined
    return `${tonnes(schedule.reduce((s, y) => s + y.tonnes, 0))} of ${fruitWords({ ...row, varietyName: variety?.name ?? null })}${span ? `, ${span}` : ''}`
  },
}

const REFUSALS: DbRefusals = {
  missingReference: { field: 'varietyId', message: 'That variety is no longer in the catalogue' },
}

function termsOf(row: FruitContractRow, schedule: ScheduleYearInput[]): FruitTerms {
  const terms = Object.fromEntries(FRUIT_TERM_KEYS.map(k => [k, row[k]])) as unknown as Omit<FruitTerms, 'schedule'>
  return { ...terms, schedule, expiresOn: dateOnly(terms.expiresOn as string | null) }
}

function classOf(row: FruitContractRow) {
  const species = row.varietyId ? row.varietySpecies : row.species
  const juiceClass = (row.varietyId ? row.varietyJuiceClass : row.juiceClass) as JuiceClass | null
  return juiceClass ? forecastClassOf(species ?? 'apple', juiceClass) : null
}

async function toContract(row: FruitContractRow, schedule: ScheduleYearInput[], user: Member, options: { warning: boolean }): Promise<FruitContract> {
  const side = sideOf(FRUIT_PARTIES, row as unknown as Record<string, unknown>, user.orgId)
  const { moves, awaiting, expired } = movesFor('fruit', user, side, row)
  const { expiryNoticedVersion: _n, createdByUserId: _c, varietySpecies: _s, varietyJuiceClass: _j, ...shown } = row
  const fruitClass = classOf(row)!
  const open = row.state === 'offered' || row.state === 'countered'
  return {
    ...shown,
    ...termsOf(row, schedule),
    createdAt: new Date(row.createdAt).toISOString(),
    updatedAt: new Date(row.updatedAt).toISOString(),
    side,
    moves: moves as FruitContract['moves'],
    awaiting,
    expired,
    fruitClass,
    totalTonnes: Number(schedule.reduce((s, y) => s + y.tonnes, 0).toFixed(3)),
    settlementExamples: settlementExamples(row),
    coverageWarning: options.warning && side === 'grower' && open
      ? await offerCoverageWarning(row.growerOrgId, { id: row.id, fruitClass, schedule, tolerancePct: row.tolerancePct })
      : null,
  }
}

export async function getFruitContract(user: Member, id: number): Promise<FruitContract> {
  const db = useDb()
  const row = await findFruitContract(db, user.orgId, id)
  if (!row) notFound('That fruit contract')
  const schedules = await schedulesOf(db, [id])
  return toContract(row, schedules.get(id)!, user, { warning: true })
}

export async function listFruitContractsFor(user: Member, query: FruitContractListQuery): Promise<FruitContractList> {
  const db = useDb()
  const { rows, total } = await listFruitContracts(db, user.orgId, query)
  const schedules = await schedulesOf(db, rows.map(r => r.id))
  return { items: await Promise.all(rows.map(row => toContract(row, schedules.get(row.id)!, user, { warning: false }))), total }
}

export async function fruitContractHistory(user: Member, id: number, page: { limit: number, offset: number }): Promise<ContractHistory> {
  const row = await findFruitContract(useDb(), user.orgId, id)
  if (!row) notFound('That fruit contract')
  return historyFor(FRUIT_PARTIES, user, row, page)
}

/** The checks across fields and against the catalogue, on the terms as they will stand. */
async function checkTerms(trx: Knex.Transaction, terms: FruitTerms): Promise<void> {
  const issues = fruitTermsIssues(terms)
  if (issues.length) throw fieldError(issues)
  if (terms.varietyId !== null) {
    const variety = await trx('varieties').where({ id: terms.varietyId }).first('juiceClass') as { juiceClass: string | null } | undefined
    if (!variety) throw fieldError([{ path: 'varietyId', message: 'No variety with that id is in the catalogue' }])
    if (!variety.juiceClass) throw fieldError([{ path: 'varietyId', message: 'That variety has no juice class in the catalogue yet: contract by class instead' }])
  }
}

async function partiesOf(trx: Knex.Transaction, user: Member, input: FruitContractCreateInput) {
  const own = user.orgId
  const side: FruitContractSide = user.orgKind === 'maker' ? 'maker' : 'grower'
  const field = side === 'maker' ? 'growerOrgId' : 'makerOrgId'
  const ownField = side === 'maker' ? 'makerOrgId' : 'growerOrgId'
  if (input[ownField] !== undefined && input[ownField] !== own) throw fieldError([{ path: ownField, message: `As a ${side}, your own organisation is the ${side} of the contract` }])
  const counterpartyId = input[field]
  if (counterpartyId === undefined) throw fieldError([{ path: field, message: side === 'maker' ? 'Choose the grower you buy from' : 'Choose the maker you sell to' }])
  const [ownOrg, counterparty] = await Promise.all([findParty(trx, own), findParty(trx, counterpartyId)])
  const kind = side === 'maker' ? 'grower' : 'maker'
  if (!counterparty || counterparty.status !== 'active' || counterparty.id === own) throw fieldError([{ path: field, message: 'No organisation with that id takes contracts' }])
  if (counterparty.kind !== kind) throw fieldError([{ path: field, message: `${counterparty.name} is not a ${kind === 'maker' ? 'cider or perry maker' : 'grower'}` }])
  return { maker: side === 'maker' ? own : counterpartyId, grower: side === 'grower' ? own : counterpartyId, side, currency: ownOrg?.currency }
}

export function createFruitContract(user: Member, input: FruitContractCreateInput): Promise<number> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const { maker, grower, side, currency } = await partiesOf(trx, user, input)
    const { makerOrgId: _m, growerOrgId: _g, ...given } = input
    const terms = { ...FRUIT_TERM_DEFAULTS, currency, ...Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined)) } as FruitTerms
    await checkTerms(trx, terms)
    const { schedule, ...columns } = terms
    const id = await insertFruitContract(trx, { ...columns, makerOrgId: maker, growerOrgId: grower, draftedBy: side, state: 'draft', version: 0, createdByUserId: user.id })
    await writeSchedule(trx, id, schedule)
    await insertContractEvent(trx, { contractKind: 'fruit', contractId: id, action: 'created', version: 0, byUserId: user.id, byOrgId: user.orgId, byName: user.name, changes: [] })
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'fruit_contract.created', objectType: 'fruit_contract', objectId: id, detail: { makerOrgId: maker, growerOrgId: grower } })
    return id
  }))
}

async function patched(ctx: MoveContext<FruitContractRow, FruitContractSide>, patch: FruitTermsPatch) {
  const schedule = (await schedulesOf(ctx.trx, [ctx.row.id])).get(ctx.row.id)!
  const before = termsOf(ctx.row, schedule)
  const after = { ...before, ...Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) } as FruitTerms
  // Naming a variety replaces the class, and naming a class the variety.
  if (patch.varietyId) Object.assign(after, { species: patch.species ?? null, juiceClass: patch.juiceClass ?? null })
  if (patch.juiceClass && patch.varietyId === undefined) after.varietyId = null
  const changes = termChanges(before, after)
  await checkTerms(ctx.trx, after)
  return { after, changes }
}

async function writeTerms(trx: Knex.Transaction, id: number, terms: FruitTerms, changes: { field: string }[]): Promise<Record<string, unknown>> {
  const { schedule, ...columns } = terms
  if (changes.some(c => c.field === 'schedule')) await writeSchedule(trx, id, schedule)
  return columns
}

export function editFruitDraft(user: Member, id: number, patch: FruitTermsPatch): Promise<void> {
  return withDbRefusals(REFUSALS, () => moveContract(FRUIT_CONTRACTS, user, id, 'edit', async (ctx): Promise<MoveEffect> => {
    const { after, changes } = await patched(ctx, patch)
    return { columns: await writeTerms(ctx.trx, id, after, changes), changes }
  }))
}

export type FruitMoveBody = { reason?: string | null } | FruitTermsPatch | { version: number }

export function moveFruitContract(user: Member, id: number, action: Exclude<FruitContractAction, 'edit' | 'fulfil'>, body: FruitMoveBody): Promise<void> {
  return withDbRefusals(REFUSALS, () => moveContract(FRUIT_CONTRACTS, user, id, action, async (ctx): Promise<MoveEffect> => {
    const { row, side, trx } = ctx
    const reason = 'reason' in body ? body.reason ?? null : null
    switch (action) {
      case 'offer': {
        checkExpiryAhead(dateOnly(row.expiresOn))
        const schedule = (await schedulesOf(trx, [id])).get(id)!
        return { newVersion: true, terms: termsOf(row, schedule), reason }
      }
      case 'counter': {
        const { after, changes } = await patched(ctx, body as FruitTermsPatch)
        if (!changes.length) throw fieldError([{ path: Object.keys(body)[0] ?? 'basePricePerTonneMinor', message: 'A counter-offer changes at least one term' }])
        checkExpiryAhead(after.expiresOn)
        return { newVersion: true, columns: await writeTerms(trx, id, after, changes), changes, terms: after }
      }
      case 'accept':
        checkAcceptedVersion(row, (body as { version: number }).version)
        return { columns: { acceptedVersion: row.version } }
      case 'cancel':
        return { columns: row.state === 'accepted' ? { cancelledBy: side } : {}, reason }
      default:
        return { reason }
    }
  }))
}

/** Fulfils, one transaction each, the accepted contracts whose last delivery window has closed. */
export async function fulfilClosedContracts(limit = 50): Promise<number> {
  const db = useDb()
  let done = 0
  for (const { id } of await windowsClosed(db, today(), limit)) {
    await db.transaction(async (trx) => {
      const row = await trx('fruitContracts').where({ id, state: 'accepted' }).forUpdate().first() as (FruitContractRow & ContractRowBase) | undefined
      if (!row) return
      await trx('fruitContracts').where({ id }).update({ state: 'fulfilled', updatedAt: trx.fn.now(3) })
      const what = await FRUIT_CONTRACTS.describe(trx, row)
      await systemEvent(trx, FRUIT_CONTRACTS as unknown as ContractKindService<ContractRowBase, FruitContractSide>, row as unknown as ContractRowBase & Record<string, unknown>, 'fulfilled', {
        subject: `Fruit contract fulfilled: ${what}`,
        body: `The last delivery window of the fruit contract for ${what} has closed, so Pomewright marks it fulfilled.`,
      })
      done++
    })
  }
  return done
}
