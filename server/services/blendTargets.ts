import type { BlendTargetCreateInput, BlendTargetListQuery, BlendTargetPatchInput } from '#shared/schemas/blend'
import { BLEND_PROPERTIES, type BlendTarget, type BlendTargetRanges } from '#shared/types/blend'
import {
  deleteTargetRow, findTargetRow, insertTarget, listTargetRows, lockTarget, RANGE_COLUMNS, targetNameTaken, updateTargetRow, type BlendTargetRow,
} from '../repositories/blends'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type Db, type DbRefusals } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'

// A maker's saved blend targets: named juice specs the planner solves to. Each write is one
// transaction that checks the name is free, writes under the target's row lock and records the
// audit entry.

const REFUSALS: DbRefusals = {
  duplicate: { field: 'name', message: 'Another target of your organisation has this name', statusCode: 409 },
}

function toTarget(row: BlendTargetRow): BlendTarget {
  const ranges: BlendTargetRanges = {}
  for (const property of BLEND_PROPERTIES) {
    const [minColumn, maxColumn] = RANGE_COLUMNS[property]
    const min = row[minColumn]
    const max = row[maxColumn]
    if (min !== null && max !== null) ranges[property] = { min, max }
  }
  return {
    id: row.id, name: row.name, ranges, volumeL: row.volumeL, phNote: row.phNote, notes: row.notes,
    createdAt: new Date(row.createdAt).toISOString(), updatedAt: new Date(row.updatedAt).toISOString(),
  }
}

/** Every range column, null where the ranges give none. */
function rangeColumns(ranges: BlendTargetRanges): Record<string, number | null> {
  const columns: Record<string, number | null> = {}
  for (const property of BLEND_PROPERTIES) {
    const [minColumn, maxColumn] = RANGE_COLUMNS[property]
    columns[minColumn] = ranges[property]?.min ?? null
    columns[maxColumn] = ranges[property]?.max ?? null
  }
  return columns
}

async function checkNameFree(db: Db, orgId: number, name: string, exceptId?: number): Promise<void> {
  if (await targetNameTaken(db, orgId, name, exceptId)) {
    throw fieldError([{ path: 'name', message: `Your organisation already has a target named ${name}` }], { statusCode: 409 })
  }
}

export async function listBlendTargets(orgId: number, query: BlendTargetListQuery): Promise<{ items: BlendTarget[], total: number }> {
  const { rows, total } = await listTargetRows(useDb(), orgId, query)
  return { items: rows.map(toTarget), total }
}

/** The organisation's target; another's is not found (404). */
export async function getBlendTarget(orgId: number, id: number): Promise<BlendTarget> {
  const row = await findTargetRow(useDb(), orgId, id)
  if (!row) notFound('That blend target')
  return toTarget(row)
}

export function createBlendTarget(orgId: number, actorId: number, input: BlendTargetCreateInput): Promise<number> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    await checkNameFree(trx, orgId, input.name)
    const id = await insertTarget(trx, {
      orgId, name: input.name, ...rangeColumns(input.ranges), volumeL: input.volumeL, phNote: input.phNote, notes: input.notes, createdByUserId: actorId,
    })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'blend_target.created', objectType: 'blend_target', objectId: id, detail: { name: input.name } })
    return id
  }))
}

export function updateBlendTarget(orgId: number, actorId: number, id: number, patch: BlendTargetPatchInput): Promise<void> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const current = await lockTarget(trx, orgId, id)
    if (!current) notFound('That blend target')
    if (patch.name !== undefined && patch.name !== current.name) await checkNameFree(trx, orgId, patch.name, id)
    const { ranges, ...rest } = patch
    const changes: Record<string, unknown> = ranges ? rangeColumns(ranges) : {}
    for (const [key, value] of Object.entries(rest)) if (value !== undefined) changes[key] = value
    await updateTargetRow(trx, orgId, id, changes)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'blend_target.updated', objectType: 'blend_target', objectId: id, detail: { changed: Object.keys(patch).filter(k => patch[k as keyof BlendTargetPatchInput] !== undefined) } })
  }))
}

export function deleteBlendTarget(orgId: number, actorId: number, id: number): Promise<void> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const target = await lockTarget(trx, orgId, id)
    if (!target) notFound('That blend target')
    await deleteTargetRow(trx, orgId, id)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'blend_target.deleted', objectType: 'blend_target', objectId: id, detail: { name: target.name } })
  }))
}
