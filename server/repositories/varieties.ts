import type { Knex } from 'knex'
import type { VarietyCreateInput, VarietyListQuery, VarietyPatchInput } from '../../shared/schemas/catalogue'
import type { Variety, VarietyList } from '../../shared/types/catalogue'
import { recordAudit } from '../utils/audit'
import { guardCatalogueWrite, whereNameContains } from '../utils/catalogue'
import { useDb } from '../utils/db'

interface Row {
  id: number, name: string, species: Variety['species'], juice_class: Variety['juiceClass']
  typical_brix: number | null, typical_ta_g_per_l: number | null, typical_tannin_g_per_l: number | null
  harvest_season: Variety['harvestSeason'], source: string | null, created_at: Date | string, updated_at: Date | string
}

const COLUMNS: Record<keyof VarietyCreateInput, string> = {
  name: 'name',
  species: 'species',
  juiceClass: 'juice_class',
  typicalBrix: 'typical_brix',
  typicalTaGPerL: 'typical_ta_g_per_l',
  typicalTanninGPerL: 'typical_tannin_g_per_l',
  harvestSeason: 'harvest_season',
  source: 'source',
}

const orNumber = (v: number | null) => (v === null ? null : Number(v))

function toVariety(r: Row): Variety {
  return {
    id: r.id,
    name: r.name,
    species: r.species,
    juiceClass: r.juice_class,
    typicalBrix: orNumber(r.typical_brix),
    typicalTaGPerL: orNumber(r.typical_ta_g_per_l),
    typicalTanninGPerL: orNumber(r.typical_tannin_g_per_l),
    harvestSeason: r.harvest_season,
    source: r.source,
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
  }
}

function toColumns(input: VarietyPatchInput): Record<string, unknown> {
  return Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)
    .map(([k, v]) => [COLUMNS[k as keyof VarietyCreateInput], v]))
}

async function findVariety(db: Knex | Knex.Transaction, id: number): Promise<Variety> {
  const row = await db('varieties').where({ id }).first() as Row | undefined
  if (!row) throw createError({ statusCode: 404, message: 'That variety was not found.' })
  return toVariety(row)
}

export async function listVarieties(query: VarietyListQuery): Promise<VarietyList> {
  const base = useDb()('varieties').modify((q) => {
    if (query.q) whereNameContains(q, 'name', query.q)
    if (query.species) q.where('species', query.species)
    if (query.juiceClass) q.where('juice_class', query.juiceClass)
  })
  const [rows, [{ total }]] = await Promise.all([
    base.clone().select('*').orderBy([{ column: 'species' }, { column: 'name' }, { column: 'id' }]).limit(query.limit).offset(query.offset) as Promise<Row[]>,
    base.clone().count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { items: rows.map(toVariety), total: Number(total) }
}

export function getVariety(id: number): Promise<Variety> {
  return findVariety(useDb(), id)
}

const taken = (name: string | undefined) => ({ field: 'name', message: `A variety named "${name}" is already in the catalogue` })

export async function createVariety(actorId: number, input: VarietyCreateInput): Promise<Variety> {
  return guardCatalogueWrite({ duplicate: taken(input.name) }, () => useDb().transaction(async (trx) => {
    const [id] = await trx('varieties').insert(toColumns(input))
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: 'variety.created', objectType: 'variety', objectId: id!, detail: { name: input.name } })
    return findVariety(trx, id!)
  }))
}

export async function updateVariety(actorId: number, id: number, patch: VarietyPatchInput): Promise<Variety> {
  return guardCatalogueWrite({ duplicate: taken(patch.name) }, () => useDb().transaction(async (trx) => {
    const current = await trx('varieties').where({ id }).forUpdate().first('name') as { name: string } | undefined
    if (!current) throw createError({ statusCode: 404, message: 'That variety was not found.' })
    await trx('varieties').where({ id }).update({ ...toColumns(patch), updated_at: trx.fn.now(3) })
    const changed = Object.keys(patch).filter(k => patch[k as keyof VarietyPatchInput] !== undefined)
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: 'variety.updated', objectType: 'variety', objectId: id, detail: { name: current.name, changed } })
    return findVariety(trx, id)
  }))
}

export async function deleteVariety(actorId: number, id: number): Promise<void> {
  let name = 'This variety'
  const inUse = () => `${name} is named by orchard blocks or other records, so it cannot be deleted. Correct its details instead.`
  await guardCatalogueWrite({ inUse }, () => useDb().transaction(async (trx) => {
    const row = await trx('varieties').where({ id }).forUpdate().first('name') as { name: string } | undefined
    if (!row) throw createError({ statusCode: 404, message: 'That variety was not found.' })
    name = row.name
    await trx('varieties').where({ id }).delete()
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: 'variety.deleted', objectType: 'variety', objectId: id, detail: { name: row.name } })
  }))
}
