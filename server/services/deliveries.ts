import type { Knex } from 'knex'
import { DELIVERY_FIELDS, weighTicketIssues, type DeliveryCreateInput, type DeliveryDisputeInput, type DeliveryListQuery, type DeliveryPatchInput, type DeliverySettleInput, type DeliveryWithdrawInput } from '#shared/schemas/delivery'
import type { Delivery, DeliveryDetail, DeliveryEvent, DeliveryList, DeliverySide, ExcessDecision } from '#shared/types/delivery'
import { formatContractMoney } from '#shared/utils/contractDisplay'
import { settleLoad, type SettledLoad } from '#shared/utils/deliverySettlement'
import { checkDeliveryMove, deliveryActionsFor, type DeliveryMoveAction } from '#shared/utils/deliveryStatus'
import { contractYearSummary, excessOfLoad, toleranceBandKg } from '#shared/utils/deliveryYear'
import type { FruitPriceTerms } from '#shared/utils/settlement'
import { sgToBrix } from '#shared/utils/sugar'
import {
  contractCoversLot, contractYear, findDeliveryRow, findGrowerLot, findLotReading, insertDelivery, insertDeliveryEvent, latestSugarReading,
  listDeliveryEvents, listDeliveryRows, lockContractYear, lockDeliveryRow, lockLot, lockYearDeliveries, lotDeliveredKg, setLotState,
  taxRateOf, updateDeliveryRow, yearDeliveredKg, type DeliveryRow, type GrowerLot, type SugarReading, type YearDelivery,
} from '../repositories/deliveries'
import { findFruitContract, schedulesOf, type FruitContractRow } from '../repositories/fruitContracts'
import { recordAudit } from '../utils/audit'
import { transactionRetried, useDb, type Db } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'
import { tellParty, type Member } from './contracts'

// Deliveries at the press: the buying maker records each load against an accepted fruit contract
// and one of its grower's lots, and Pomewright works the settlement from the contract's terms, the
// reading paid on and the seller's tax. Each write is one transaction. Recording and correcting
// lock, in this order, the contract year (so the year's loads are counted against its tolerance
// one writer at a time), the lot (so it is never delivered beyond its net kg), the delivery and the
// year's other loads; the other moves lock the delivery alone. Each then writes, records the history
// and the audit entry, and tells the other side, all in the same transaction.

/** A contract deliveries are recorded against: accepted, or fulfilled once its last window closed. */
const RECORDING_STATES = ['accepted', 'fulfilled']

const kg = (value: number) => Math.round(value * 10) / 10
const kgText = (value: number) => `${kg(value).toLocaleString('en-GB')} kg`

function termsOf(contract: FruitContractRow): FruitPriceTerms {
  const { basePricePerTonneMinor, baselineBrix, bonusPerBrixPerTonneMinor, deductionPerBrixPerTonneMinor, rejectFloorBrix, maxRotPct, maxDamagePct } = contract
  return { basePricePerTonneMinor, baselineBrix, bonusPerBrixPerTonneMinor, deductionPerBrixPerTonneMinor, rejectFloorBrix, maxRotPct, maxDamagePct }
}

type LoadFacts = Pick<YearDelivery, 'netKg' | 'readingBrix' | 'rotPct' | 'damagePct' | 'qualityRejectReason' | 'excessKg' | 'excessDecision'>

function worked(contract: FruitContractRow, load: LoadFacts, taxRatePct: number | null): SettledLoad {
  return settleLoad(termsOf(contract), {
    netKg: load.netKg, brix: load.readingBrix, rotPct: load.rotPct, damagePct: load.damagePct,
    excessKg: load.excessKg, excessDecision: load.excessDecision, qualityRejectReason: load.qualityRejectReason,
  }, taxRatePct)
}

/** The columns a worked settlement fills, as the table keeps them. */
function settlementColumns(done: SettledLoad) {
  return { settlement: JSON.stringify(done.settlement), amountMinor: done.amountMinor, taxRatePct: done.taxRatePct, taxMinor: done.taxMinor, totalMinor: done.totalMinor }
}

function sideOf(row: Pick<DeliveryRow, 'makerOrgId'>, orgId: number): DeliverySide {
  return row.makerOrgId === orgId ? 'maker' : 'grower'
}

function toDelivery(row: DeliveryRow, user: Member): Delivery {
  const side = sideOf(row, user.orgId)
  // Who typed it in is kept for the audit, not shown: the history names the person.
  const { recordedByUserId: _by, ...shown } = row as DeliveryRow & { recordedByUserId?: number | null }
  return {
    ...shown,
    side,
    moves: deliveryActionsFor({ state: row.state, disputedBy: row.disputedBy }, { role: user.role as 'owner' | 'member' | 'viewer', side }),
    settledAt: row.settledAt ? new Date(row.settledAt).toISOString() : null,
    paidAt: row.paidAt ? new Date(row.paidAt).toISOString() : null,
    createdAt: new Date(row.createdAt).toISOString(),
    updatedAt: new Date(row.updatedAt).toISOString(),
  }
}

// ----- Reads -----

export async function listDeliveries(user: Member, query: DeliveryListQuery): Promise<DeliveryList> {
  const { rows, total } = await listDeliveryRows(useDb(), user.orgId, query)
  return { items: rows.map(r => toDelivery(r, user)), total }
}

export async function getDelivery(user: Member, id: number): Promise<DeliveryDetail> {
  const db = useDb()
  const row = await findDeliveryRow(db, user.orgId, id)
  if (!row) notFound('That delivery')
  const [history, contract, year, deliveredKg] = await Promise.all([
    listDeliveryEvents(db, id),
    db('fruitContracts').where({ id: row.fruitContractId }).first('tolerancePct', 'cropFailure') as Promise<Pick<FruitContractRow, 'tolerancePct' | 'cropFailure'>>,
    contractYear(db, row.fruitContractId, row.harvestYear),
    yearDeliveredKg(db, row.fruitContractId, row.harvestYear),
  ])
  return {
    ...toDelivery(row, user),
    history,
    year: contractYearSummary({
      fruitContractId: row.fruitContractId, harvestYear: row.harvestYear, contractedTonnes: year?.tonnes ?? 0,
      tolerancePct: contract.tolerancePct, cropFailure: contract.cropFailure, deliveredKg,
    }),
  }
}

// ----- What a load is checked against -----

/** The caller's own fruit contract as its maker (404 otherwise), in a state that takes deliveries (409 otherwise). */
async function makersContract(db: Db, user: Member, id: number): Promise<FruitContractRow> {
  const contract = await findFruitContract(db, user.orgId, id)
  if (!contract || contract.makerOrgId !== user.orgId) {
    throw fieldError([{ path: 'fruitContractId', message: 'None of your fruit contracts has that id' }], { statusCode: 404, message: 'That fruit contract was not found.' })
  }
  if (!RECORDING_STATES.includes(contract.state)) {
    throw createError({ statusCode: 409, message: `This fruit contract is ${contract.state}: deliveries are recorded only against an accepted contract.`, data: { state: contract.state } })
  }
  return contract
}

function contractFruit(contract: FruitContractRow): string {
  if (contract.varietyName) return contract.varietyName
  return contract.species === 'pear' ? `${contract.juiceClass} perry pears` : `${contract.juiceClass} apples`
}

/**
 * The lot, if the contract covers it. The maker cannot see other growers' lots, so a lot that is not
 * the contract's grower's is only "not a lot of this contract's grower"; of the grower's own lots the
 * answer says which of year and fruit is wrong.
 */
async function coveredLot(db: Db, contract: FruitContractRow, lotId: number): Promise<GrowerLot> {
  const lot = await findGrowerLot(db, contract.growerOrgId, lotId)
  if (!lot) throw fieldError([{ path: 'lotId', message: `That is not a lot of this contract's grower (${contract.growerOrgName})` }])
  if (await contractCoversLot(db, contract.id, lotId)) return lot
  const years = ((await schedulesOf(db, [contract.id])).get(contract.id) ?? []).map(y => y.year)
  const message = years.includes(lot.harvestYear)
    ? `Lot ${lot.code} is ${lot.varietyName}, which is not the contract's fruit (${contractFruit(contract)})`
    : `Lot ${lot.code} was harvested in ${lot.harvestYear}; the contract covers the ${years.join(', ')} harvest${years.length === 1 ? '' : 's'}`
  throw fieldError([{ path: 'lotId', message }])
}

/** The °Brix a reading gives: as read, or from its SG (NBS Circular 440's cubic, shared/utils/sugar.ts). */
function brixOf(reading: SugarReading): number | null {
  if (reading.brix !== null) return reading.brix
  return reading.sg === null ? null : Math.round(sgToBrix(reading.sg) * 100) / 100
}

/** The reading paid on: the one chosen, which must be the lot's; else the lot's latest with a sugar figure. */
async function readingPaidOn(db: Db, lot: Pick<GrowerLot, 'id' | 'code'>, readingId: number | null): Promise<{ readingId: number, readingBrix: number, readingSampledOn: string }> {
  const reading = readingId === null ? await latestSugarReading(db, lot.id) : await findLotReading(db, lot.id, readingId)
  if (!reading) {
    throw fieldError([{ path: 'readingId', message: readingId === null ? `Lot ${lot.code} has no reading with a °Brix or SG yet: test the lot first` : `That is not a reading of lot ${lot.code}` }])
  }
  const brix = brixOf(reading)
  if (brix === null) throw fieldError([{ path: 'readingId', message: 'That reading has no °Brix or SG to pay on: choose another, or test the lot again' }])
  return { readingId: reading.id, readingBrix: brix, readingSampledOn: reading.sampledOn }
}

/** Under the lot's lock: the load fits in what is left of the lot (400 naming netKg otherwise). */
async function checkLotLeft(trx: Knex.Transaction, lotId: number, code: string, netKg: number, exceptDeliveryId?: number): Promise<LotAfter> {
  const lot = (await lockLot(trx, lotId))!
  const before = await lotDeliveredKg(trx, lotId, exceptDeliveryId)
  const left = kg(Math.max(0, lot.netKg - before))
  if (kg(before + netKg) > kg(lot.netKg)) {
    throw fieldError([{ path: 'netKg', message: `Lot ${code} has ${kgText(left)} left to deliver of its ${kgText(lot.netKg)}: ${kgText(netKg)} is more` }])
  }
  return { id: lotId, netKg: lot.netKg, state: lot.state, deliveredKg: kg(before + netKg) }
}

/** The lot as its lock read it, with what its deliveries will come to. */
interface LotAfter { id: number, netKg: number, state: string, deliveredKg: number }

/** A lot whose deliveries reach its net kg is delivered; one a correction takes back below it is available again. */
async function markLot(trx: Knex.Transaction, lot: LotAfter): Promise<void> {
  const full = lot.deliveredKg >= kg(lot.netKg)
  if (full && lot.state === 'available') await setLotState(trx, lot.id, 'delivered')
  if (!full && lot.state === 'delivered') await setLotState(trx, lot.id, 'available')
}

/**
 * Works each load's kilograms past the contract year's tolerance again, under the year's lock. The
 * year's excess is what it holds past the band's top. A settled or paid load keeps the excess it
 * was settled with (the maker decided on it, and the grower may have been paid); the rest falls on
 * the open loads, past the top in the order they were delivered (day, then entry). With no settled
 * load in the year, that is each load's part past the top given the loads before it. An open load
 * whose excess moves has its settlement worked again.
 */
async function recountYear(trx: Knex.Transaction, contract: FruitContractRow, harvestYear: number, contractedTonnes: number, taxRatePct: number | null): Promise<Map<number, number>> {
  const { highestKg } = toleranceBandKg(contractedTonnes, contract.tolerancePct)
  const loads = await lockYearDeliveries(trx, contract.id, harvestYear)
  const sum = (list: YearDelivery[], of: (l: YearDelivery) => number) => kg(list.reduce((total, l) => total + of(l), 0))
  const isFinal = (l: YearDelivery) => l.state === 'settled' || l.state === 'paid'
  const open = loads.filter(l => !isFinal(l))
  const openKg = sum(open, l => l.netKg)
  const left = Math.max(0, kg(sum(loads, l => l.netKg) - highestKg - sum(loads.filter(isFinal), l => l.excessKg)))
  // The top the open loads are counted against, among themselves.
  const openTop = kg(openKg - Math.min(left, openKg))
  const excess = new Map<number, number>()
  let before = 0
  for (const load of open) {
    const excessKg = excessOfLoad(openTop, before, load.netKg)
    before = kg(before + load.netKg)
    excess.set(load.id, excessKg)
    if (excessKg === kg(load.excessKg)) continue
    await updateDeliveryRow(trx, load.id, { excessKg, ...settlementColumns(worked(contract, { ...load, excessKg }, taxRatePct)) })
  }
  return excess
}

async function orgName(trx: Knex.Transaction, id: number): Promise<string> {
  const row = await trx('organisations').where({ id }).first('name') as { name: string } | undefined
  return row?.name ?? 'The other party'
}

interface Told { row: Pick<DeliveryRow, 'id' | 'makerOrgId' | 'growerOrgId'>, side: DeliverySide, action: string, subject: string, body: string }

/** Tells the other side's owners and members, in the move's transaction. */
async function tellOtherSide(trx: Knex.Transaction, user: Member, told: Told): Promise<void> {
  const other = told.side === 'maker' ? told.row.growerOrgId : told.row.makerOrgId
  const actorOrg = await orgName(trx, user.orgId)
  await tellParty(trx, other, user.id, {
    subject: `${actorOrg} ${told.subject}`,
    body: `${user.name} of ${actorOrg} ${told.body}`,
    link: `/deliveries/${told.row.id}`,
    kind: `delivery.${told.action}`,
  })
}

async function audit(trx: Knex.Transaction, user: Member, id: number, action: string, detail: Record<string, unknown>): Promise<void> {
  await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: `delivery.${action}`, objectType: 'delivery', objectId: id, detail })
}

const money = (minor: number, currency: string) => formatContractMoney(minor, currency)

// ----- Writes -----

export function recordDelivery(user: Member, input: DeliveryCreateInput): Promise<number> {
  return transactionRetried(async (trx) => {
    const contract = await makersContract(trx, user, input.fruitContractId)
    const lot = await coveredLot(trx, contract, input.lotId)
    if (input.deliveredOn < lot.pickedOn) throw fieldError([{ path: 'deliveredOn', message: `Lot ${lot.code} was picked on ${lot.pickedOn}: it cannot be delivered before` }])
    const year = await lockContractYear(trx, contract.id, lot.harvestYear)
    const lotAfter = await checkLotLeft(trx, lot.id, lot.code, input.netKg)
    const reading = await readingPaidOn(trx, lot, input.readingId)
    const taxRatePct = await taxRateOf(trx, contract.growerOrgId)
    const load = { ...input, ...reading, netKg: kg(input.netKg), excessKg: 0, excessDecision: null }
    const id = await insertDelivery(trx, {
      fruitContractId: contract.id, makerOrgId: contract.makerOrgId, growerOrgId: contract.growerOrgId, lotId: lot.id, harvestYear: lot.harvestYear,
      deliveredOn: input.deliveredOn, ticketNo: input.ticketNo, grossKg: input.grossKg, tareKg: input.tareKg, netKg: load.netKg,
      readingId: reading.readingId, readingBrix: reading.readingBrix, readingSampledOn: reading.readingSampledOn,
      rotPct: input.rotPct, damagePct: input.damagePct, qualityRejectReason: input.qualityRejectReason, notes: input.notes,
      state: 'recorded', version: 1, currency: contract.currency, recordedByUserId: user.id,
      ...settlementColumns(worked(contract, load, taxRatePct)),
    })
    const excess = await recountYear(trx, contract, lot.harvestYear, year!.tonnes, taxRatePct)
    await markLot(trx, lotAfter)
    await insertDeliveryEvent(trx, { deliveryId: id, action: 'recorded', version: 1, byUserId: user.id, byOrgId: user.orgId, byName: user.name })
    await audit(trx, user, id, 'recorded', { fruitContractId: contract.id, lotId: lot.id, netKg: load.netKg })
    const stored = await trx('deliveries').where({ id }).first('totalMinor') as { totalMinor: number }
    const past = excess.get(id) ? ` (${kgText(excess.get(id)!)} of it past the ${lot.harvestYear} tolerance)` : ''
    await tellOtherSide(trx, user, {
      row: { id, makerOrgId: contract.makerOrgId, growerOrgId: contract.growerOrgId }, side: 'maker', action: 'recorded',
      subject: `recorded a delivery of lot ${lot.code}: ${kgText(load.netKg)}`,
      body: `recorded a delivery of ${kgText(load.netKg)} of lot ${lot.code} on ${input.deliveredOn}${past}, paid on ${reading.readingBrix} °Brix: ${money(stored.totalMinor, contract.currency)} with tax, before settlement.`,
    })
    return id
  })
}

type NewEvent = Pick<DeliveryEvent, 'action' | 'version' | 'changes' | 'reason'>

/** The state the move leads to; 403 for the wrong person or side, 409 with the state it is in. */
function checked(action: DeliveryMoveAction, row: Pick<DeliveryRow, 'state' | 'disputedBy' | 'version'>, user: Member, side: DeliverySide) {
  const check = checkDeliveryMove(action, { state: row.state, disputedBy: row.disputedBy }, { role: user.role as 'owner' | 'member' | 'viewer', side })
  if (!check.ok) throw createError({ statusCode: check.statusCode, message: check.message, data: { state: check.state, version: row.version } })
  return check.to
}

interface MoveContext {
  trx: Knex.Transaction
  row: Omit<DeliveryRow, 'makerOrgName' | 'growerOrgName' | 'lotCode' | 'varietyName'>
  side: DeliverySide
}

/**
 * One move on a delivery the caller is a party to, in one transaction: locks the row (404 when it
 * is not the caller's), checks the move (403 for the wrong person or side, 409 with the state),
 * lets `effect` write, then records the history and the audit entry and tells the other side.
 */
async function moveDelivery(
  user: Member, id: number, action: DeliveryMoveAction,
  effect: (ctx: MoveContext) => Promise<{ columns: Record<string, unknown>, event: Omit<NewEvent, 'version'>, subject: string, body: string }>,
): Promise<void> {
  await transactionRetried(async (trx) => {
    const row = await lockDeliveryRow(trx, user.orgId, id)
    if (!row) notFound('That delivery')
    const side = sideOf(row, user.orgId)
    const to = checked(action, row, user, side)
    const done = await effect({ trx, row, side })
    await updateDeliveryRow(trx, id, { ...done.columns, state: to })
    await insertDeliveryEvent(trx, { deliveryId: id, ...done.event, version: row.version, byUserId: user.id, byOrgId: user.orgId, byName: user.name })
    await audit(trx, user, id, done.event.action, { from: row.state, to, version: row.version })
    await tellOtherSide(trx, user, { row, side, action: done.event.action, subject: done.subject, body: done.body })
  })
}

export function disputeDelivery(user: Member, id: number, input: DeliveryDisputeInput): Promise<void> {
  return moveDelivery(user, id, 'dispute', async ({ row, side }) => ({
    columns: { disputedBy: side, disputeReason: input.reason },
    event: { action: 'disputed', changes: [], reason: input.reason },
    subject: `disputed a delivery of ${kgText(row.netKg)}`,
    body: `disputed the delivery of ${kgText(row.netKg)} on ${row.deliveredOn}: ${input.reason}`,
  }))
}

export function withdrawDispute(user: Member, id: number, input: DeliveryWithdrawInput): Promise<void> {
  return moveDelivery(user, id, 'withdraw-dispute', async ({ trx, row }) => {
    // Back to recorded: the maker settles it again, and decides again on any excess.
    const contract = await trx('fruitContracts').where({ id: row.fruitContractId }).first() as FruitContractRow
    const taxRatePct = await taxRateOf(trx, row.growerOrgId)
    return {
      columns: { disputedBy: null, disputeReason: null, excessDecision: null, settledAt: null, ...settlementColumns(worked(contract, { ...row, excessDecision: null }, taxRatePct)) },
      event: { action: 'dispute-withdrawn', changes: [], reason: input.reason },
      subject: `withdrew their dispute of a delivery of ${kgText(row.netKg)}`,
      body: `withdrew their dispute of the delivery of ${kgText(row.netKg)} on ${row.deliveredOn}${input.reason ? `: ${input.reason}` : '.'}`,
    }
  })
}

const DECISION: Record<NonNullable<DeliverySettleInput['excess']>, ExcessDecision> = { accept: 'accepted', refuse: 'refused' }

export function settleRecordedDelivery(user: Member, id: number, input: DeliverySettleInput): Promise<void> {
  return moveDelivery(user, id, 'settle', async ({ trx, row }) => {
    const hasExcess = row.excessKg > 0
    if (hasExcess && !input.excess) {
      throw fieldError([{ path: 'excess', message: `${kgText(row.excessKg)} of this load is past the year's tolerance: accept or refuse it` }])
    }
    const excessDecision = hasExcess ? DECISION[input.excess!] : null
    const contract = await trx('fruitContracts').where({ id: row.fruitContractId }).first() as FruitContractRow
    const done = worked(contract, { ...row, excessDecision }, await taxRateOf(trx, row.growerOrgId))
    const refused = excessDecision === 'refused' ? `, refusing ${kgText(row.excessKg)} past the tolerance` : ''
    return {
      columns: { excessDecision, settledAt: trx.fn.now(3), ...settlementColumns(done) },
      event: { action: 'settled', changes: [], reason: null },
      subject: `settled a delivery of ${kgText(row.netKg)}: ${money(done.totalMinor, row.currency)}`,
      body: `settled the delivery of ${kgText(row.netKg)} on ${row.deliveredOn}${refused}: ${money(done.amountMinor, row.currency)} and ${money(done.taxMinor, row.currency)} tax, ${money(done.totalMinor, row.currency)} in all.`,
    }
  })
}

type Figures = Pick<DeliveryRow, 'deliveredOn' | 'ticketNo' | 'grossKg' | 'tareKg' | 'netKg' | 'readingId' | 'rotPct' | 'damagePct' | 'qualityRejectReason' | 'notes'>

/**
 * The maker's correction: a new version of the figures, the settlement and the year's excess worked
 * again, and the history of what changed. A correction of a disputed load answers the dispute and
 * makes it recorded again; a recorded load has no excess decision yet (that comes with settling).
 */
export function correctDelivery(user: Member, id: number, patch: DeliveryPatchInput): Promise<void> {
  return transactionRetried(async (trx) => {
    const found = await findDeliveryRow(trx, user.orgId, id)
    if (!found) notFound('That delivery')
    // The contract year first, as every write of a year's loads takes it, and the lot, as a new load
    // of it takes it; then the delivery again under them.
    const year = await lockContractYear(trx, found.fruitContractId, found.harvestYear)
    await lockLot(trx, found.lotId)
    const row = await lockDeliveryRow(trx, user.orgId, id)
    if (!row) notFound('That delivery')
    const side = sideOf(row, user.orgId)
    const to = checked('edit', row, user, side)
    const given = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) as Partial<Figures>
    const after: Figures = { ...(Object.fromEntries(DELIVERY_FIELDS.map(f => [f, row[f]])) as unknown as Figures), ...given }
    const ticket = weighTicketIssues(after)
    if (ticket.length) throw fieldError(ticket)
    const lot = (await findGrowerLot(trx, row.growerOrgId, row.lotId))!
    if (after.deliveredOn < lot.pickedOn) throw fieldError([{ path: 'deliveredOn', message: `Lot ${lot.code} was picked on ${lot.pickedOn}: it cannot be delivered before` }])
    const reading = 'readingId' in given
      ? await readingPaidOn(trx, lot, given.readingId ?? null)
      : { readingId: row.readingId, readingBrix: row.readingBrix, readingSampledOn: row.readingSampledOn }
    const lotAfter = await checkLotLeft(trx, lot.id, lot.code, after.netKg, id)

    const changes: DeliveryEvent['changes'] = []
    const next = { ...after, ...reading, netKg: kg(after.netKg) }
    for (const field of [...DELIVERY_FIELDS, 'readingBrix', 'readingSampledOn'] as const) {
      if (JSON.stringify(row[field] ?? null) !== JSON.stringify(next[field] ?? null)) changes.push({ field, from: row[field] ?? null, to: next[field] ?? null })
    }
    if (!changes.length) throw fieldError([{ path: Object.keys(given)[0] ?? 'netKg', message: 'These are the figures already recorded: change at least one' }])

    const contract = await trx('fruitContracts').where({ id: row.fruitContractId }).first() as FruitContractRow
    const taxRatePct = await taxRateOf(trx, row.growerOrgId)
    const done = worked(contract, { ...next, excessKg: row.excessKg, excessDecision: null }, taxRatePct)
    if (done.totalMinor !== row.totalMinor) changes.push({ field: 'totalMinor', from: row.totalMinor, to: done.totalMinor })
    const version = row.version + 1
    await updateDeliveryRow(trx, id, {
      ...next, state: to, version, disputedBy: null, disputeReason: null, excessDecision: null, settledAt: null, ...settlementColumns(done),
    })
    await recountYear(trx, contract, row.harvestYear, year!.tonnes, taxRatePct)
    await markLot(trx, lotAfter)
    await insertDeliveryEvent(trx, { deliveryId: id, action: 'corrected', version, byUserId: user.id, byOrgId: user.orgId, byName: user.name, changes })
    await audit(trx, user, id, 'corrected', { from: row.state, to, version, changed: changes.map(c => c.field) })
    const listed = changes.map(c => `${c.field} ${c.from ?? '—'} → ${c.to ?? '—'}`).join('; ')
    await tellOtherSide(trx, user, {
      row, side, action: 'corrected',
      subject: `corrected a delivery of lot ${lot.code} (version ${version})`,
      body: `corrected the delivery of lot ${lot.code} on ${next.deliveredOn} (version ${version}): ${listed}. It now comes to ${money(done.totalMinor, row.currency)} with tax.`,
    })
  })
}
