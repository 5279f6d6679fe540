import type { Knex } from 'knex'
import { bearingYearsIssue, type RootstockCreateInput, type RootstockListQuery, type RootstockPatchInput } from '../../shared/schemas/catalogue'
import type { Rootstock, RootstockList } from '../../shared/types/catalogue'
import { recordAudit } from '../utils/audit'
import { guardCatalogueWrite, whereNameContains } from '../utils/catalogue'
import { useDb } from '../utils/db'

interface Row {
  id: number, designation: string, species: Rootstock['species'], vigour: Rootstock['vigour']
  size_pct_of_seedling: number | null, needs_support: boolean, in_row_m: number | null, between_row_m: number | null
  years_to_first_crop: number | null, years_to_full_bearing: number | null, yield_per_tree_kg: number | null
  source: string | null, created_at: Date | string, updated_at: Date | string
}

const COLUMNS: Record<keyof RootstockCreateInput, string> = {
  designation: 'designation',
  species: 'species',
  vigour: 'vigour',
  sizePctOfSeedling: 'size_pct_of_seedling',
  needsSupport: 'needs_support',
  inRowM: 'in_row_m',
  betweenRowM: 'between_row_m',
  yearsToFirstCrop: 'years_to_first_crop',
  yearsToFullBearing: 'years_to_full_bearing',
  yieldPerTreeKg: 'yield_per_tree_kg',
  source: 'source',
}

const orNumber = (v: number | null) => (v === null ? null : Number(v))

function toRootstock(r: Row): Rootstock {
  return {
    id: r.id,
    designation: r.designation,
    species: r.species,
    vigour: r.vigour,
    sizePctOfSeedling: orNumber(r.size_pct_of_seedling),
    needsSupport: Boolean(r.needs_support),
    inRowM: orNumber(r.in_row_m),
    betweenRowM: orNumber(r.between_row_m),
    yearsToFirstCrop: orNumber(r.years_to_first_crop),
    yearsToFullBearing: orNumber(r.years_to_full_bearing),
    yieldPerTreeKg: orNumber(r.yield_per_tree_kg),
    source: r.source,
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
  }
}

function toColumns(input: RootstockPatchInput): Record<string, unknown> {
  return Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)
    .map(([k, v]) => [COLUMNS[k as keyof RootstockCreateInput], v]))
}

async function findRootstock(db: Knex | Knex.Transaction, id: number): Promise<Rootstock> {
  const row = await db('rootstocks').where({ id }).first() as Row | undefined
  if (!row) throw createError({ statusCode: 404, message: 'That rootstock was not found.' })
  return toRootstock(row)
}

export async function listRootstocks(query: RootstockListQuery): Promise<RootstockList> {
  const base = useDb()('rootstocks').modify((q) => {
    if (query.q) whereNameContains(q, 'designation', query.q)
    if (query.species) q.where('species', query.species)
    if (query.vigour) q.where('vigour', query.vigour)
  })
  // Apple before pear, then from the most dwarfing stock to seedling.
  const order = [{ column: 'species' }, { column: 'size_pct_of_seedling' }, { column: 'designation' }, { column: 'id' }]
  const [rows, [{ total }]] = await Promise.all([
    base.clone().select('*').orderBy(order).limit(query.limit).offset(query.offset) as Promise<Row[]>,
    base.clone().count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { items: rows.map(toRootstock), total: Number(total) }
}

export function getRootstock(id: number): Promise<Rootstock> {
  return findRootstock(useDb(), id)
}

const taken = (designation: string | undefined) => ({ field: 'designation', message: `A rootstock designated "${designation}" is already in the catalogue` })

export async function createRootstock(actorId: number, input: RootstockCreateInput): Promise<Rootstock> {
  return guardCatalogueWrite({ duplicate: taken(input.designation) }, () => useDb().transaction(async (trx) => {
    const [id] = await trx('rootstocks').insert(toColumns(input))
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: 'rootstock.created', objectType: 'rootstock', objectId: id!, detail: { designation: input.designation } })
    return findRootstock(trx, id!)
  }))
}

export async function updateRootstock(actorId: number, id: number, patch: RootstockPatchInput): Promise<Rootstock> {
  return guardCatalogueWrite({ duplicate: taken(patch.designation) }, () => useDb().transaction(async (trx) => {
    const current = await trx('rootstocks').where({ id }).forUpdate().first() as Row | undefined
    if (!current) throw createError({ statusCode: 404, message: 'That rootstock was not found.' })
    // A patch of one bearing figure must still agree with the stored other one.
    const issue = bearingYearsIssue(
      patch.yearsToFirstCrop !== undefined ? patch.yearsToFirstCrop : orNumber(current.years_to_first_crop),
      patch.yearsToFullBearing !== undefined ? patch.yearsToFullBearing : orNumber(current.years_to_full_bearing),
    )
    if (issue) {
      const path = patch.yearsToFullBearing !== undefined ? 'yearsToFullBearing' : 'yearsToFirstCrop'
      throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `${path}: ${issue}`, data: { issues: [{ path, message: issue }] } })
    }
    await trx('rootstocks').where({ id }).update({ ...toColumns(patch), updated_at: trx.fn.now(3) })
    const changed = Object.keys(patch).filter(k => patch[k as keyof RootstockPatchInput] !== undefined)
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: 'rootstock.updated', objectType: 'rootstock', objectId: id, detail: { designation: current.designation, changed } })
    return findRootstock(trx, id)
  }))
}

export async function deleteRootstock(actorId: number, id: number): Promise<void> {
  let designation = 'This rootstock'
  const inUse = () => `${designation} is named by orchard blocks or other records, so it cannot be deleted. Correct its details instead.`
  await guardCatalogueWrite({ inUse }, () => useDb().transaction(async (trx) => {
    const row = await trx('rootstocks').where({ id }).forUpdate().first('designation') as { designation: string } | undefined
    if (!row) throw createError({ statusCode: 404, message: 'That rootstock was not found.' })
    designation = row.designation
    await trx('rootstocks').where({ id }).delete()
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: 'rootstock.deleted', objectType: 'rootstock', objectId: id, detail: { designation: row.designation } })
  }))
}
