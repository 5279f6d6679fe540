import type { Knex } from 'knex'
import QRCode from 'qrcode'
import type { EventCreateInput, LinerGrade, RowCreateInput, RowListQuery, RowPatchInput, RunCreateInput, RunListQuery, RunPatchInput } from '#shared/schemas/nursery'
import type { NurseryRow, NurseryRun, PropagationEvent, RunTag, RunWarning } from '#shared/types/nursery'
import { CountRefusal, expectedFinished, runCounts } from '#shared/utils/runCounts'
import { linerStock, lockLinerStock } from '../repositories/linerStock'
import { findField, findRow, insertRow, listRows, lockRow, updateRow } from '../repositories/nurseryRows'
import {
  eventsOfRuns, findBudwoodLot, findEvent, findEventByClientKey, findNurseryContract, findRunIdByTag, findRunRow, findRunRowsByIds,
  insertEvent, insertRun, lastHeldPosition, listEvents, listRunRows, lockOwnRuns, lockRun, markTagsPrinted, runInTheWay, updateRunRow, type RunRow,
} from '../repositories/nurseryRuns'
import { recordAudit } from '../utils/audit'
import { isDbError, useDb, withDbRefusals, type Db, type DbRefusals } from '../utils/db'
import { appLink } from '../utils/mail'
import { newTagCode, normaliseTagCode, TAG_CODE_PATTERN } from '../utils/tagCode'
import { fieldError, notFound } from '../utils/validation'
import { suspectExposures, type SuspectMark } from './budwood'
import { checkCatalogue } from './catalogue'
import type { Member } from './contracts'
import { tellBuyerOfProgress } from './treeContractProgress'

// The row map: rows of the nursery's fields, runs along them (one rootstock, meant for one variety,
// maybe serving a tree contract) and the dated events on a run. Each write is one transaction with
// the rows it depends on locked: the organisation's liner stock and the row when a run is lined
// out, the run when an event is recorded, so two phones at once can neither double-book positions
// or liners nor lose a count. A run's counts, expected trees and warnings are worked out on every
// read from its events; nothing derived is stored.

// ----- Rows -----

const ROW_REFUSALS: DbRefusals = {
  duplicate: { field: 'name', message: 'A row of that name is already in this field' },
}

export function listRowsFor(orgId: number, query: RowListQuery) {
  return listRows(useDb(), orgId, query)
}

export async function getRow(orgId: number, id: number): Promise<NurseryRow> {
  const row = await findRow(useDb(), orgId, id)
  if (!row) notFound('That row')
  return row
}

export function createRow(user: Member, input: RowCreateInput): Promise<number> {
  return withDbRefusals(ROW_REFUSALS, () => useDb().transaction(async (trx) => {
    const field = await findField(trx, user.orgId, input.fieldId)
    if (!field) throw fieldError([{ path: 'fieldId', message: 'No field of your nursery has that id' }])
    if (field.kind !== 'field') throw fieldError([{ path: 'fieldId', message: `${field.name} is a ${field.kind} bed, not a nursery-row field` }])
    const id = await insertRow(trx, user.orgId, input)
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'nursery_row.created', objectType: 'nursery_row', objectId: id, detail: { name: input.name, positions: input.positions } })
    return id
  }))
}

export function updateRowFor(user: Member, id: number, patch: RowPatchInput): Promise<void> {
  return withDbRefusals(ROW_REFUSALS, () => useDb().transaction(async (trx) => {
    const row = await lockRow(trx, user.orgId, id)
    if (!row) notFound('That row')
    if (patch.positions !== undefined) {
      const last = await lastHeldPosition(trx, user.orgId, id)
      if (patch.positions < last) throw fieldError([{ path: 'positions', message: `Runs hold positions up to ${last} of row ${row.name}: the row needs at least ${last} positions` }])
    }
    const changes = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) as RowPatchInput
    await updateRow(trx, user.orgId, id, changes)
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'nursery_row.updated', objectType: 'nursery_row', objectId: id, detail: { changed: Object.keys(changes) } })
  }))
}

// ----- A run as the API answers it -----

const dateOf = (d: Date | string) => new Date(d).toISOString().slice(0, 10)
const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString())

/** What a person should look at on a run: a suspect lot's exposure, mismatches with its contract and its buds, and a stale tag. */
function runWarnings(row: RunRow, events: PropagationEvent[], suspect: SuspectMark[]): RunWarning[] {
  const warnings: RunWarning[] = suspect.map(s => ({
    code: 'suspect-budwood' as const,
    message: s.reason === 'budded-with-lot'
      ? `Budwood lot ${s.label}, worked on this run on ${s.on}, is suspect of disease since ${s.suspectOn}: see the lot's exposure list`
      : `Worked on ${s.on} after budwood lot ${s.label} by the same hands; the lot is suspect of disease since ${s.suspectOn}: see the lot's exposure list`,
  }))
  if (row.contractId !== null) {
    if (row.contractVarietyId !== row.varietyId) {
      warnings.push({ code: 'contract-variety', message: `Contract ${row.contractId} is for ${row.contractVarietyName}; this run is meant for ${row.varietyName}` })
    }
    if (row.contractRootstockId !== row.rootstockId) {
      warnings.push({ code: 'contract-rootstock', message: `Contract ${row.contractId} is for trees on ${row.contractRootstockDesignation}; this run is on ${row.rootstockDesignation}` })
    }
  }
  for (const e of events) {
    if (e.kind !== 'budded' && e.kind !== 'grafted') continue
    const what = e.kind === 'budded' ? 'Budded' : 'Grafted'
    if (e.varietyId !== row.varietyId) {
      warnings.push({ code: 'budded-variety', message: `${what} on ${e.happenedOn} with ${e.varietyName}, not ${row.varietyName}` })
    }
    if (e.budwoodLotId === null) {
      warnings.push({ code: 'no-budwood-lot', message: `${what} on ${e.happenedOn} with no budwood lot named: those buds cannot be traced to their source` })
    }
  }
  if (row.tagPrintedAt && new Date(row.tagPrintedAt) < new Date(row.identityChangedAt)) {
    warnings.push({ code: 'stale-tag', message: `The tag was printed on ${dateOf(row.tagPrintedAt)}, before the variety or rootstock changed on ${dateOf(row.identityChangedAt)}: print it again` })
  }
  return warnings
}

function toRun(row: RunRow, events: PropagationEvent[], suspect: SuspectMark[]): NurseryRun {
  const counts = runCounts(row.linedOutCount, events)
  const contract = row.contractId === null
    ? null
    : {
        id: row.contractId, buyerOrgName: row.contractBuyerOrgName!, varietyId: row.contractVarietyId!, rootstockId: row.contractRootstockId!,
        treeCount: row.contractTreeCount!, takeRate: row.contractTakeRate!, survivalRate: row.contractSurvivalRate!, state: row.contractState!,
      }
  return {
    id: row.id, rowId: row.rowId, rowName: row.rowName, fieldName: row.fieldName, fromPosition: row.fromPosition, toPosition: row.toPosition,
    rootstockId: row.rootstockId, rootstockDesignation: row.rootstockDesignation, rootstockNeedsSupport: Boolean(row.rootstockNeedsSupport),
    interstem: row.interstem, linerGrade: row.linerGrade, linedOutOn: row.linedOutOn, linedOutCount: row.linedOutCount,
    varietyId: row.varietyId, varietyName: row.varietyName, treeContractId: row.treeContractId, contract,
    tagCode: row.tagCode, tagPrintedAt: iso(row.tagPrintedAt), identityChangedAt: iso(row.identityChangedAt)!, notes: row.notes,
    counts,
    expected: contract ? expectedFinished(counts, { takeRate: contract.takeRate, survivalRate: contract.survivalRate }) : null,
    warnings: runWarnings(row, events, suspect),
    createdAt: iso(row.createdAt)!, updatedAt: iso(row.updatedAt)!,
  }
}

async function withEvents(db: Db, orgId: number, rows: RunRow[]): Promise<NurseryRun[]> {
  const events = await eventsOfRuns(db, orgId, rows.map(r => r.id))
  const byRun = new Map<number, PropagationEvent[]>()
  for (const e of events) byRun.set(e.runId, [...byRun.get(e.runId) ?? [], e])
  const suspect = await suspectExposures(db, orgId)
  return rows.map(row => toRun(row, byRun.get(row.id) ?? [], suspect.get(row.id) ?? []))
}

export async function getRun(orgId: number, id: number): Promise<NurseryRun> {
  const db = useDb()
  const row = await findRunRow(db, orgId, id)
  if (!row) notFound('That run')
  return (await withEvents(db, orgId, [row]))[0]!
}

export async function listRuns(orgId: number, query: RunListQuery): Promise<{ items: NurseryRun[], total: number }> {
  const db = useDb()
  if (query.hasWarnings === undefined) {
    const { rows, total } = await listRunRows(db, orgId, query, query)
    return { items: await withEvents(db, orgId, rows), total }
  }
  // Warnings come from the events, so the filter works on the runs themselves; a nursery's map is
  // hundreds of runs, not millions.
  const { rows } = await listRunRows(db, orgId, query)
  const matching = (await withEvents(db, orgId, rows)).filter(run => (run.warnings.length > 0) === query.hasWarnings)
  return { items: matching.slice(query.offset, query.offset + query.limit), total: matching.length }
}

/** The run a tag's code names (as typed or scanned); another organisation's code is not found. */
export async function getRunByTag(orgId: number, typed: string): Promise<NurseryRun> {
  const code = normaliseTagCode(typed)
  if (!TAG_CODE_PATTERN.test(code)) throw fieldError([{ path: 'code', message: 'A tag code is ten letters and digits, as printed under the QR code' }])
  const id = await findRunIdByTag(useDb(), orgId, code)
  if (!id) notFound('A run with that tag')
  return getRun(orgId, id)
}

/** What a tag carries: its code, the address its QR code opens, and the QR code as SVG. */
export async function runTag(orgId: number, id: number): Promise<RunTag> {
  const run = await findRunRow(useDb(), orgId, id)
  if (!run) notFound('That run')
  const url = appLink(`/nursery/t/${run.tagCode}`)
  return { code: run.tagCode, url, qrSvg: await QRCode.toString(url, { type: 'svg' }) }
}

// ----- Lining out and correcting runs -----

const RUN_REFUSALS: DbRefusals = {
  missingReference: { field: 'varietyId', message: 'The variety, rootstock or contract is no longer there' },
}

const CONTRACT_STATES_FOR_RUNS = ['accepted', 'propagating', 'ready']

function checkSpan(row: { name: string, positions: number }, span: { fromPosition: number, toPosition: number }): void {
  if (span.toPosition < span.fromPosition) throw fieldError([{ path: 'toPosition', message: 'The last position must be at or after the first' }])
  if (span.toPosition > row.positions) {
    throw fieldError([{ path: 'toPosition', message: `Row ${row.name} has ${row.positions} positions: the last position can be at most ${row.positions}` }])
  }
}

/** 409 when another run of the row holds any of the positions, naming it. */
async function checkFree(trx: Knex.Transaction, orgId: number, row: { id: number, name: string }, span: { fromPosition: number, toPosition: number }, exceptId?: number): Promise<void> {
  const other = await runInTheWay(trx, orgId, row.id, span, exceptId)
  if (!other) return
  const message = `Positions ${other.fromPosition}–${other.toPosition} of row ${row.name} hold run ${other.id} (${other.varietyName} on ${other.rootstockDesignation})`
  throw createError({ statusCode: 409, message, data: { runId: other.id, issues: [{ path: 'fromPosition', message }] } })
}

async function checkContract(trx: Knex.Transaction, orgId: number, id: number): Promise<void> {
  const contract = await findNurseryContract(trx, orgId, id)
  if (!contract) throw fieldError([{ path: 'treeContractId', message: 'No tree contract with that id has your nursery as its nursery' }])
  if (!CONTRACT_STATES_FOR_RUNS.includes(contract.state)) {
    throw fieldError([{ path: 'treeContractId', message: `Tree contract ${id} is ${contract.state}: runs serve only accepted, propagating or ready contracts` }])
  }
}

/** The liners of the rootstock and grade still in stock must cover the run (liner stock locked first). */
async function checkStock(trx: Knex.Transaction, orgId: number, rootstockId: number, grade: LinerGrade, wanted: number): Promise<void> {
  const [stock] = await linerStock(trx, orgId, { rootstockId, grade })
  const inStock = stock?.inStock ?? 0
  if (inStock >= wanted) return
  const designation = stock?.rootstockDesignation ?? (await trx('rootstocks').where({ id: rootstockId }).first('designation') as { designation: string }).designation
  throw fieldError([{ path: 'linedOutCount', message: `Only ${inStock.toLocaleString('en-GB')} liners of ${designation} ${grade} are in stock` }])
}

/** Inserts the run under a fresh tag code; a clash with another run's code (rare) draws again. */
async function insertWithTag(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await insertRun(trx, { ...row, tagCode: newTagCode() })
    }
    catch (error) {
      const clash = isDbError(error, 1062) && String((error as Error).message).includes('tag_code')
      if (!clash || attempt >= 5) throw error
    }
  }
}

export function createRun(user: Member, input: RunCreateInput): Promise<number> {
  return withDbRefusals(RUN_REFUSALS, () => useDb().transaction(async (trx) => {
    // Liner stock first, then the row: the same order everywhere, so two at once wait, not deadlock.
    await lockLinerStock(trx, user.orgId)
    const row = await lockRow(trx, user.orgId, input.rowId)
    if (!row) throw fieldError([{ path: 'rowId', message: 'No row of your nursery has that id' }])
    checkSpan(row, input)
    await checkFree(trx, user.orgId, row, input)
    await checkCatalogue(trx, input.varietyId, input.rootstockId)
    if (input.treeContractId !== null) await checkContract(trx, user.orgId, input.treeContractId)
    if (input.linerGrade !== null) await checkStock(trx, user.orgId, input.rootstockId, input.linerGrade, input.linedOutCount)
    const id = await insertWithTag(trx, { orgId: user.orgId, ...input })
    await insertEvent(trx, { orgId: user.orgId, runId: id, kind: 'lined-out', happenedOn: input.linedOutOn, count: input.linedOutCount, byUserId: user.id, byName: user.name })
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'nursery_run.created', objectType: 'nursery_run', objectId: id, detail: { rowId: row.id, fromPosition: input.fromPosition, toPosition: input.toPosition, linedOutCount: input.linedOutCount } })
    return id
  }))
}

export function updateRun(user: Member, id: number, patch: RunPatchInput): Promise<void> {
  return withDbRefusals(RUN_REFUSALS, () => useDb().transaction(async (trx) => {
    const run = await lockRun(trx, user.orgId, id)
    if (!run) notFound('That run')
    const changes = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) as RunPatchInput
    const rootstockChanged = changes.rootstockId !== undefined && changes.rootstockId !== run.rootstockId
    const varietyChanged = changes.varietyId !== undefined && changes.varietyId !== run.varietyId
    // A corrected rootstock moves the run's liners to that rootstock's stock.
    if (rootstockChanged && run.linerGrade) await lockLinerStock(trx, user.orgId)
    const row = (await lockRow(trx, user.orgId, run.rowId))!
    const span = { fromPosition: changes.fromPosition ?? run.fromPosition, toPosition: changes.toPosition ?? run.toPosition }
    if (changes.fromPosition !== undefined || changes.toPosition !== undefined) {
      checkSpan(row, span)
      await checkFree(trx, user.orgId, row, span, id)
    }
    if (rootstockChanged || varietyChanged) await checkCatalogue(trx, changes.varietyId ?? run.varietyId, changes.rootstockId ?? run.rootstockId)
    if (changes.treeContractId && changes.treeContractId !== run.treeContractId) await checkContract(trx, user.orgId, changes.treeContractId)
    if (rootstockChanged && run.linerGrade) await checkStock(trx, user.orgId, changes.rootstockId!, run.linerGrade, run.linedOutCount)
    // A tag printed before this names the wrong tree: the run warns until it is printed again.
    const identity = rootstockChanged || varietyChanged ? { identityChangedAt: trx.fn.now(3) } : {}
    await updateRunRow(trx, user.orgId, id, { ...changes, ...identity })
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'nursery_run.updated', objectType: 'nursery_run', objectId: id, detail: { changed: Object.keys(changes), identityChanged: rootstockChanged || varietyChanged } })
  }))
}

// ----- Events on a run -----

export async function listRunEvents(orgId: number, runId: number, page: { limit: number, offset: number }): Promise<{ items: PropagationEvent[], total: number }> {
  const db = useDb()
  if (!await findRunRow(db, orgId, runId)) notFound('That run')
  return listEvents(db, orgId, runId, page)
}

const EVENT_REFUSALS: DbRefusals = {
  duplicate: { field: 'clientKey', message: 'That entry key was already used for another entry' },
  missingReference: { field: 'varietyId', message: 'The variety or budwood lot is no longer there' },
}

/**
 * Budding and grafting name a variety in the catalogue and, if any, a budwood lot of the nursery's
 * of that variety. Budding the interstem names its lot only: the interstem is the run's own text.
 */
async function checkBuds(trx: Knex.Transaction, orgId: number, input: Extract<EventCreateInput, { kind: 'budded' | 'grafted' | 'interstem-budded' }>): Promise<void> {
  const variety = input.kind === 'interstem-budded' ? null : await trx('varieties').where({ id: input.varietyId }).first('name') as { name: string } | undefined
  if (variety === undefined) throw fieldError([{ path: 'varietyId', message: 'No variety with that id is in the catalogue' }])
  if (input.budwoodLotId === null) return
  const lot = await findBudwoodLot(trx, orgId, input.budwoodLotId)
  if (!lot) throw fieldError([{ path: 'budwoodLotId', message: 'No budwood lot of your nursery has that id' }])
  if (variety && input.kind !== 'interstem-budded' && lot.varietyId !== input.varietyId) throw fieldError([{ path: 'budwoodLotId', message: `Budwood lot ${lot.label} is ${lot.varietyName}, not ${variety.name}` }])
}

/**
 * Records one event on a run, counted with the run locked, so events sent at once are counted one
 * after another. An entry whose key was recorded before is answered with that event (`replayed`)
 * and nothing is written: a phone resending what it made offline.
 */
export function recordEvent(user: Member, runId: number, input: EventCreateInput): Promise<{ event: PropagationEvent, replayed: boolean }> {
  return withDbRefusals(EVENT_REFUSALS, () => useDb().transaction(async (trx) => {
    const run = await lockRun(trx, user.orgId, runId)
    if (!run) notFound('That run')
    if (input.clientKey) {
      const earlier = await findEventByClientKey(trx, user.orgId, input.clientKey)
      if (earlier && earlier.runId !== runId) throw fieldError([{ path: 'clientKey', message: `That entry key was already used for run ${earlier.runId}` }], { statusCode: 409 })
      if (earlier) return { event: (await findEvent(trx, user.orgId, earlier.id))!, replayed: true }
    }
    if (input.happenedOn < run.linedOutOn) throw fieldError([{ path: 'happenedOn', message: `The run was lined out on ${run.linedOutOn}: record what happened on or after that day` }])
    if (input.kind === 'interstem-budded' && !run.interstem) {
      throw fieldError([{ path: 'kind', message: 'This run has no interstem: name the interstem on the run first, or record the budding of the variety' }])
    }
    if (input.kind === 'budded' || input.kind === 'grafted' || input.kind === 'interstem-budded') await checkBuds(trx, user.orgId, input)
    const events = await eventsOfRuns(trx, user.orgId, [runId])
    try {
      // The new entry goes last among the day's events, as it is recorded last.
      runCounts(run.linedOutCount, [...events, { ...input, id: Number.MAX_SAFE_INTEGER }])
    }
    catch (error) {
      if (error instanceof CountRefusal) throw fieldError([{ path: error.field, message: error.message }])
      throw error
    }
    const id = await insertEvent(trx, { orgId: user.orgId, runId, ...input, clientKey: input.clientKey ?? null, byUserId: user.id, byName: user.name })
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'propagation_event.recorded', objectType: 'nursery_run', objectId: runId, detail: { eventId: id, kind: input.kind } })
    await tellBuyerOfProgress(trx, user.orgId, runId, id)
    return { event: (await findEvent(trx, user.orgId, id))!, replayed: false }
  }))
}

// ----- Tags -----

/** Marks the runs' tags printed now; one id that is not the organisation's run refuses them all (404). */
export async function markPrinted(user: Member, runIds: number[]): Promise<{ items: NurseryRun[], total: number }> {
  const ids = [...new Set(runIds)]
  await useDb().transaction(async (trx) => {
    const own = new Set(await lockOwnRuns(trx, user.orgId, ids))
    const missing = ids.filter(id => !own.has(id))
    if (missing.length) throw createError({ statusCode: 404, message: `Your nursery has no run ${missing.join(', ')}: no tag was marked printed.`, data: { runIds: missing } })
    await markTagsPrinted(trx, user.orgId, ids)
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'nursery_run.tags_printed', objectType: 'nursery_run', objectId: null, detail: { runIds: ids } })
  })
  const db = useDb()
  const items = await withEvents(db, user.orgId, await findRunRowsByIds(db, user.orgId, ids))
  return { items, total: items.length }
}
