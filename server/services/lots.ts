import type { LotCreateInput, LotListQuery, LotPatchInput, ReadingCreateInput } from '#shared/schemas/lot'
import type { HarvestLot, JuiceReading } from '#shared/types/lot'
import { normaliseReading, readingClass } from '#shared/utils/juiceReading'
import type { FruitSpecies } from '#shared/utils/juiceClass'
import {
  calibrationOf, codeTaken, countReadings, deleteLotRow, findLotRow, findOwnBlock, findReadingRow, findVariety, insertLot,
  insertReading, latestReadingRows, listLotRows, listReadingRows, lockOwnLot, updateLotRow, type LotRow, type ReadingRow,
} from '../repositories/lots'
import { lotDeliveredKg } from '../repositories/deliveries'
import { findOrgSheet } from '../repositories/labImport'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type Db, type DbRefusals } from '../utils/db'
import { conflict, fieldError, notFound } from '../utils/validation'

// Harvest lots: each write is one transaction that checks the block and variety, writes under the
// lot's row lock and records the audit entry. Reads answer the lot with its latest reading and class.

const REFUSALS: DbRefusals = {
  duplicate: { field: 'code', message: 'Another lot of your organisation has this code' },
  missingReference: { field: 'varietyId', message: 'The variety or block is no longer there' },
  inUse: { message: 'Records refer to this lot, so it cannot be deleted.' },
}

function toReading(row: ReadingRow, species: FruitSpecies): JuiceReading {
  return { ...row, juiceClass: readingClass(row, species) }
}

function toLot(row: LotRow, latest: ReadingRow | undefined): HarvestLot {
  const latestReading = latest ? toReading(latest, row.species) : null
  return { ...row, latestReading, juiceClass: latestReading?.juiceClass ?? null }
}

export async function listLots(orgId: number, query: LotListQuery) {
  const db = useDb()
  const { rows, total, netKg } = await listLotRows(db, orgId, query)
  const latest = await latestReadingRows(db, rows.map(r => r.id))
  return { items: rows.map(r => toLot(r, latest.get(r.id))), total, totals: { lots: total, netKg } }
}

/** A lot the organisation may see, with its latest reading; anything else is not found (404). */
export async function getLot(orgId: number, id: number): Promise<HarvestLot> {
  const db = useDb()
  const row = await findLotRow(db, orgId, id)
  if (!row) notFound('That lot')
  const latest = await latestReadingRows(db, [id])
  return toLot(row, latest.get(id))
}

export async function listReadings(orgId: number, lotId: number, page: { limit: number, offset: number }) {
  const db = useDb()
  const lot = await findLotRow(db, orgId, lotId)
  if (!lot) notFound('That lot')
  const { rows, total } = await listReadingRows(db, lotId, page)
  return { items: rows.map(r => toReading(r, lot.species)), total }
}

/** The variety a lot of `blockId` and `varietyId` grows: the block's when none is given; a block of another variety is refused. */
async function checkedVariety(db: Db, orgId: number, blockId: number | null, varietyId: number | undefined): Promise<number> {
  if (blockId !== null) {
    const block = await findOwnBlock(db, orgId, blockId)
    if (!block) throw fieldError([{ path: 'blockId', message: 'Choose one of your organisation\'s blocks' }])
    if (varietyId !== undefined && varietyId !== block.varietyId) {
      throw fieldError([{ path: 'blockId', message: `Block ${block.name} grows ${block.varietyName}, not the variety chosen` }])
    }
    return block.varietyId
  }
  if (varietyId === undefined || !(await findVariety(db, varietyId))) throw fieldError([{ path: 'varietyId', message: 'Choose a variety from the catalogue' }])
  return varietyId
}

async function checkCodeFree(db: Db, orgId: number, code: string, exceptId?: number): Promise<void> {
  if (await codeTaken(db, orgId, code, exceptId)) {
    throw fieldError([{ path: 'code', message: `Your organisation already has a lot ${code}` }], { statusCode: 409 })
  }
}

const harvestYearOf = (pickedOn: string) => Number(pickedOn.slice(0, 4))

export function createLot(orgId: number, actorId: number, input: LotCreateInput): Promise<number> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const varietyId = await checkedVariety(trx, orgId, input.blockId, input.varietyId)
    await checkCodeFree(trx, orgId, input.code)
    const id = await insertLot(trx, {
      orgId, code: input.code, blockId: input.blockId, varietyId, pickedOn: input.pickedOn, harvestYear: harvestYearOf(input.pickedOn),
      netKg: Number(input.netKg.toFixed(1)), bins: input.bins, notes: input.notes, createdByUserId: actorId,
    })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'lot.created', objectType: 'harvest_lot', objectId: id, detail: { code: input.code, netKg: input.netKg } })
    return id
  }))
}

export function updateLot(orgId: number, actorId: number, id: number, patch: LotPatchInput): Promise<void> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const current = await lockOwnLot(trx, orgId, id)
    if (!current) notFound('That lot')
    const changes: Record<string, unknown> = {}
    for (const [key, value] of Object.entries(patch)) if (value !== undefined) changes[key] = value
    if (patch.blockId !== undefined || patch.varietyId !== undefined) {
      const blockId = patch.blockId === undefined ? current.blockId : patch.blockId
      // A new block alone brings its variety; a new variety alone must still match the block kept.
      const varietyId = patch.varietyId ?? (patch.blockId !== undefined && patch.blockId !== null ? undefined : current.varietyId)
      changes.varietyId = await checkedVariety(trx, orgId, blockId, varietyId)
    }
    if (patch.code !== undefined && patch.code !== current.code) await checkCodeFree(trx, orgId, patch.code, id)
    if (patch.pickedOn) changes.harvestYear = harvestYearOf(patch.pickedOn)
    if (typeof patch.netKg === 'number') {
      changes.netKg = Number(patch.netKg.toFixed(1))
      // Deliveries are weighed against the lot's net kg: it may not fall below what has gone to the press.
      const delivered = await lotDeliveredKg(trx, id)
      if (Number(changes.netKg) < delivered) throw fieldError([{ path: 'netKg', message: `${delivered.toLocaleString('en-GB')} kg of this lot have been delivered, so its net weight cannot be less than that` }])
      // As a delivery does: all of it delivered makes the lot delivered, kilograms added make it available again.
      if (delivered > 0 && current.state === 'available' && Number(changes.netKg) === delivered) changes.state = 'delivered'
      if (current.state === 'delivered' && Number(changes.netKg) > delivered) changes.state = 'available'
    }
    await updateLotRow(trx, orgId, id, changes)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'lot.updated', objectType: 'harvest_lot', objectId: id, detail: { changed: Object.keys(changes) } })
  }))
}

/** Deleted only while nothing refers to it; else 409 saying what does. */
export function deleteLot(orgId: number, actorId: number, id: number): Promise<void> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const lot = await lockOwnLot(trx, orgId, id)
    if (!lot) notFound('That lot')
    const readings = await countReadings(trx, id)
    if (readings) conflict(`Lot ${lot.code} has ${readings} juice reading${readings === 1 ? '' : 's'}, so it cannot be deleted.`)
    await deleteLotRow(trx, orgId, id)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'lot.deleted', objectType: 'harvest_lot', objectId: id, detail: { code: lot.code } })
  }))
}

/** A reading typed by hand, normalised at the organisation's hydrometer calibration temperature. */
export async function addReading(orgId: number, actorId: number, lotId: number, input: ReadingCreateInput): Promise<JuiceReading> {
  const db = useDb()
  const id = await db.transaction(async (trx) => {
    const lot = await lockOwnLot(trx, orgId, lotId)
    if (!lot) notFound('That lot')
    const variety = await findVariety(trx, lot.varietyId)
    const { sampledOn, notes, labSheetId, ...raw } = input
    const result = normaliseReading(raw, { calibrationC: await calibrationOf(trx, orgId), species: variety!.species })
    if (!result.ok) throw fieldError(result.issues.map(i => ({ path: i.field, message: i.message })))
    // Typed in beside a PDF: the reading keeps the sheet it came from. A CSV or workbook is imported instead.
    if (labSheetId) {
      const sheet = await findOrgSheet(trx, orgId, labSheetId)
      if (!sheet) throw fieldError([{ path: 'labSheetId', message: 'That sheet is not one of your organisation\'s' }])
      if (sheet.kind !== 'pdf') throw fieldError([{ path: 'labSheetId', message: 'Readings are typed in only from a PDF sheet; import a CSV or XLSX sheet instead' }])
    }
    const readingId = await insertReading(trx, { ...result.reading, orgId, lotId, sampledOn, notes, enteredByUserId: actorId, labSheetId: labSheetId ?? null })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'lot.reading-added', objectType: 'harvest_lot', objectId: lotId, detail: { readingId } })
    return readingId
  })
  const [row, lot] = await Promise.all([findReadingRow(db, id), findLotRow(db, orgId, lotId)])
  return toReading(row!, lot!.species)
}
