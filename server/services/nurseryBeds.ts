import type { Knex } from 'knex'
import type { BedCreateInput, BedPatchInput, BedRecordCreateInput } from '#shared/schemas/nursery'
import type { BedRecord, LinerLot, NurseryBed } from '#shared/types/nursery'
import { BED_FIELDS, bedFieldIssues, bedRecordIssues, type BedField } from '#shared/utils/bedRules'
import { findCatalogueRow } from '../repositories/catalogue'
import { findLinerLot, insertLinerLot } from '../repositories/linerLots'
import { lockLinerStock } from '../repositories/linerStock'
import { findBed, findBedRecord, insertBed, insertBedRecord, listBedRecords, lockBed, updateBedRow } from '../repositories/nurseryBeds'
import { ROOTSTOCKS } from '../repositories/rootstocks'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type DbRefusals } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'

// Nursery beds and their yearly records: each write is one transaction that checks the bed's kind
// (shared/utils/bedRules), writes and records the audit entry. Liners lifted from a bed become a
// liner lot in the same transaction, under the organisation's liner-stock lock.

function refusals(name?: string): DbRefusals {
  return {
    duplicate: { field: 'name', issue: 'Another bed already has this name', message: `A bed named "${name ?? ''}" is already in your nursery. Choose another name.` },
    missingReference: { field: 'rootstockId', message: 'The rootstock is no longer in the catalogue' },
  }
}

export async function getBed(orgId: number, id: number): Promise<NurseryBed> {
  const bed = await findBed(useDb(), orgId, id)
  if (!bed) notFound('That bed')
  return bed
}

async function checkRootstock(trx: Knex.Transaction, rootstockId: number | null | undefined): Promise<void> {
  if (typeof rootstockId !== 'number') return
  if (!await findCatalogueRow(trx, ROOTSTOCKS, rootstockId)) throw fieldError([{ path: 'rootstockId', message: 'No rootstock with that id is in the catalogue' }])
}

export function createBed(orgId: number, actorId: number, input: BedCreateInput): Promise<number> {
  return withDbRefusals(refusals(input.name), () => useDb().transaction(async (trx) => {
    const issues = bedFieldIssues(input.kind, input)
    if (issues.length) throw fieldError(issues)
    await checkRootstock(trx, input.rootstockId)
    const id = await insertBed(trx, orgId, input)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'nursery_bed.created', objectType: 'nursery_bed', objectId: id, detail: { name: input.name, kind: input.kind } })
    return id
  }))
}

export function updateBed(orgId: number, actorId: number, id: number, patch: BedPatchInput): Promise<void> {
  return withDbRefusals(refusals(patch.name), () => useDb().transaction(async (trx) => {
    const current = await lockBed(trx, orgId, id)
    if (!current) notFound('That bed')
    const sent = BED_FIELDS.filter(field => patch[field] !== undefined) as BedField[]
    const after = Object.fromEntries(BED_FIELDS.map(field => [field, patch[field] !== undefined ? patch[field] : current[field]]))
    const issues = bedFieldIssues(current.kind, after, sent)
    if (issues.length) throw fieldError(issues)
    await checkRootstock(trx, patch.rootstockId)
    const changes = Object.fromEntries(Object.entries(patch).filter(([, value]) => value !== undefined)) as BedPatchInput
    await updateBedRow(trx, orgId, id, changes)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'nursery_bed.updated', objectType: 'nursery_bed', objectId: id, detail: { name: current.name, changed: Object.keys(changes) } })
  }))
}

/** A record as made: liners lifted also answer the liner lot they became. */
export type BedRecordCreated = BedRecord & { linerLot: LinerLot | null }

export async function createBedRecord(orgId: number, actorId: number, bedId: number, input: BedRecordCreateInput): Promise<BedRecordCreated> {
  const { recordId, lotId } = await useDb().transaction(async (trx) => {
    const lifting = input.kind === 'liners-lifted'
    // Stock first, then the bed: every writer of liner stock takes the organisation's lock first.
    if (lifting) await lockLinerStock(trx, orgId)
    const bed = await lockBed(trx, orgId, bedId)
    if (!bed) notFound('That bed')
    const issues = bedRecordIssues(bed.kind, input)
    if (issues.length) throw fieldError(issues)
    if (lifting && bed.rootstockId === null) {
      throw fieldError([{ path: 'kind', message: `Name the rootstock of ${bed.name} before recording liners lifted from it` }])
    }
    const recordId = await insertBedRecord(trx, orgId, bedId, actorId, input)
    const lotId = lifting
      ? await insertLinerLot(trx, orgId, { rootstockId: bed.rootstockId!, grade: input.grade!, source: 'lifted', count: input.count!, receivedOn: input.doneOn, bedRecordId: recordId })
      : null
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'nursery_bed_record.created', objectType: 'nursery_bed_record', objectId: recordId, detail: { bedId, kind: input.kind, count: input.count, linerLotId: lotId } })
    return { recordId, lotId }
  })
  const db = useDb()
  const [record, linerLot] = await Promise.all([findBedRecord(db, orgId, recordId), lotId ? findLinerLot(db, orgId, lotId) : undefined])
  return { ...record!, linerLot: linerLot ?? null }
}

/** A bed's records, the latest first; another organisation's bed is not found. */
export async function listRecordsOfBed(orgId: number, bedId: number, page: { limit: number, offset: number }): Promise<{ items: BedRecord[], total: number }> {
  await getBed(orgId, bedId)
  return listBedRecords(orgId, bedId, page)
}
