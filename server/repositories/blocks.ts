import type { Knex } from 'knex'
import type { BlockCreateInput, BlockPatchInput } from '../../shared/schemas/block'
import type { BlockList, BlockWithoutCurve, OrchardBlock, OrchardBlockDetail, OrganisationForecast } from '../../shared/types/block'
import { forecastBlock, sumForecastByClass, type ClassedBlock, type YearKg } from '../../shared/utils/forecast'
import type { JuiceClass } from '../../shared/utils/juiceClass'
import { treesPerHectare } from '../../shared/utils/planting'
import { recordAudit } from '../utils/audit'
import { bearingCurveOf } from '../utils/bearingCurve'
import { ER_NO_REFERENCED_ROW, ER_ROW_IS_REFERENCED, isDbError, useDb } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'

const COLUMNS = [
  'b.id', 'b.name', 'b.variety_id', 'v.name as variety_name', 'v.species', 'v.juice_class',
  'b.rootstock_id', 'r.designation as rootstock_designation', 'b.tree_count', 'b.year_planted', 'b.area_ha',
  'b.in_row_m', 'b.between_row_m', 'b.organic_status', 'b.survival_rate', 'b.notes', 'b.created_at', 'b.updated_at',
  'r.years_to_first_crop', 'r.years_to_full_bearing', 'r.yield_per_tree_kg',
]

/** A block joined to its variety and rootstock, as selected by COLUMNS. */
interface Row {
  id: number, name: string, variety_id: number, variety_name: string, species: OrchardBlock['species'], juice_class: JuiceClass
  rootstock_id: number, rootstock_designation: string, tree_count: number, year_planted: number, area_ha: number
  in_row_m: number, between_row_m: number, organic_status: OrchardBlock['organicStatus'], survival_rate: number, notes: string | null
  created_at: Date | string, updated_at: Date | string
  years_to_first_crop: number | null, years_to_full_bearing: number | null, yield_per_tree_kg: number | null
}

/** The organisation's blocks joined to the catalogue; scoping is part of every query. */
function blocksOf(db: Knex | Knex.Transaction, orgId: number) {
  return db('orchard_blocks as b')
    .join('varieties as v', 'v.id', 'b.variety_id')
    .join('rootstocks as r', 'r.id', 'b.rootstock_id')
    .where('b.org_id', orgId)
}

function toBlock(r: Row): OrchardBlock {
  return {
    id: r.id,
    name: r.name,
    varietyId: r.variety_id,
    varietyName: r.variety_name,
    species: r.species,
    juiceClass: r.juice_class,
    rootstockId: r.rootstock_id,
    rootstockDesignation: r.rootstock_designation,
    treeCount: r.tree_count,
    yearPlanted: r.year_planted,
    areaHa: Number(r.area_ha),
    inRowM: Number(r.in_row_m),
    betweenRowM: Number(r.between_row_m),
    densityPerHa: treesPerHectare(Number(r.in_row_m), Number(r.between_row_m)),
    organicStatus: r.organic_status,
    survivalRate: Number(r.survival_rate),
    notes: r.notes,
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
  }
}

function curveOf(r: Row) {
  return bearingCurveOf({
    designation: r.rootstock_designation,
    yearsToFirstCrop: r.years_to_first_crop === null ? null : Number(r.years_to_first_crop),
    yearsToFullBearing: r.years_to_full_bearing === null ? null : Number(r.years_to_full_bearing),
    yieldPerTreeKg: r.yield_per_tree_kg === null ? null : Number(r.yield_per_tree_kg),
  })
}

function zeros(startYear: number, years: number): YearKg[] {
  return Array.from({ length: years }, (_, i) => ({ year: startYear + i, kg: 0 }))
}

export async function listBlocks(orgId: number, page: { limit: number, offset: number }): Promise<BlockList> {
  const db = useDb()
  const [rows, [sums]] = await Promise.all([
    blocksOf(db, orgId).select(COLUMNS).orderBy([{ column: 'b.name' }, { column: 'b.id' }]).limit(page.limit).offset(page.offset) as Promise<Row[]>,
    db('orchard_blocks').where({ org_id: orgId })
      .select(db.raw('COUNT(*) AS total'), db.raw('COALESCE(SUM(tree_count), 0) AS trees'), db.raw('COALESCE(SUM(area_ha), 0) AS area_ha')) as unknown as Promise<{ total: number, trees: number, area_ha: number }[]>,
  ])
  return {
    items: rows.map(toBlock),
    total: Number(sums!.total),
    totals: { trees: Number(sums!.trees), areaHa: Number(sums!.area_ha) },
  }
}

/** One block with its yearly forecast; another organisation's block is simply not found (404). */
export async function getBlock(orgId: number, id: number, forecast: { startYear: number, years: number }): Promise<OrchardBlockDetail> {
  const row = await blocksOf(useDb(), orgId).andWhere('b.id', id).first(COLUMNS) as Row | undefined
  if (!row) notFound('That block')
  const block = toBlock(row)
  const { curve, note } = curveOf(row)
  return {
    ...block,
    bearingCurve: curve,
    forecastNote: note,
    forecast: curve
      ? forecastBlock({ trees: block.treeCount, yearPlanted: block.yearPlanted, survivalRate: block.survivalRate }, curve, forecast)
      : zeros(forecast.startYear, forecast.years),
  }
}

/** The organisation's forecast kg per juice class and year, from every block with a bearing curve. */
export async function organisationForecast(orgId: number, options: { startYear: number, years: number }): Promise<OrganisationForecast> {
  const rows = await blocksOf(useDb(), orgId).select(COLUMNS).orderBy('b.name') as Row[]
  const classed: ClassedBlock[] = []
  const blocksWithoutCurve: BlockWithoutCurve[] = []
  for (const row of rows) {
    const { curve, note } = curveOf(row)
    if (curve) classed.push({ trees: row.tree_count, yearPlanted: row.year_planted, survivalRate: Number(row.survival_rate), juiceClass: row.juice_class, curve })
    else blocksWithoutCurve.push({ id: row.id, name: row.name, rootstockDesignation: row.rootstock_designation, note })
  }
  const byClass = sumForecastByClass(classed, options)
  const years = zeros(options.startYear, options.years)
  const totals = years.map(({ year }, i) => ({ year, kg: Object.values(byClass).reduce((sum, rows) => sum + rows[i]!.kg, 0) }))
  return { startYear: options.startYear, years: years.map(y => y.year), byClass, totals, blocksWithoutCurve }
}

/** The variety and rootstock must be in the catalogue and of the same species (a pear on a pear stock). */
async function checkCatalogue(trx: Knex.Transaction, varietyId: number, rootstockId: number): Promise<void> {
  const [variety, rootstock] = await Promise.all([
    trx('varieties').where({ id: varietyId }).first('name', 'species'),
    trx('rootstocks').where({ id: rootstockId }).first('designation', 'species'),
  ])
  if (!variety) throw fieldError([{ path: 'varietyId', message: 'No variety with that id is in the catalogue' }])
  if (!rootstock) throw fieldError([{ path: 'rootstockId', message: 'No rootstock with that id is in the catalogue' }])
  if (variety.species !== rootstock.species) {
    throw fieldError([{ path: 'rootstockId', message: `${variety.name} is ${variety.species === 'apple' ? 'an apple' : 'a pear'}: choose ${variety.species === 'apple' ? 'an apple' : 'a pear'} rootstock (${rootstock.designation} is for ${rootstock.species}s)` }])
  }
}

/** A catalogue row deleted between the check and the write still answers 400, not 500. */
async function catalogueGuard<T>(write: () => Promise<T>): Promise<T> {
  try {
    return await write()
  }
  catch (e) {
    if (isDbError(e, ER_NO_REFERENCED_ROW)) throw fieldError([{ path: 'varietyId', message: 'The variety or rootstock is no longer in the catalogue' }])
    throw e
  }
}

function toColumns(input: Partial<BlockCreateInput>): Record<string, unknown> {
  const map: Record<string, string> = {
    name: 'name', varietyId: 'variety_id', rootstockId: 'rootstock_id', treeCount: 'tree_count', yearPlanted: 'year_planted',
    areaHa: 'area_ha', inRowM: 'in_row_m', betweenRowM: 'between_row_m', organicStatus: 'organic_status', survivalRate: 'survival_rate', notes: 'notes',
  }
  // Round to the columns' scale here, so a value converted from acres or feet is stored as shown.
  const places: Record<string, number> = { areaHa: 3, inRowM: 2, betweenRowM: 2, survivalRate: 3 }
  const round = (key: string, value: unknown) => typeof value === 'number' && places[key] !== undefined ? Number(value.toFixed(places[key])) : value
  return Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined).map(([k, v]) => [map[k]!, round(k, v)]))
}

export async function createBlock(orgId: number, actorId: number, input: BlockCreateInput): Promise<number> {
  return catalogueGuard(() => useDb().transaction(async (trx) => {
    await checkCatalogue(trx, input.varietyId, input.rootstockId)
    const [id] = await trx('orchard_blocks').insert({ org_id: orgId, ...toColumns(input) })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'block.created', objectType: 'orchard_block', objectId: id!, detail: { name: input.name, treeCount: input.treeCount } })
    return id!
  }))
}

export async function updateBlock(orgId: number, actorId: number, id: number, patch: BlockPatchInput): Promise<void> {
  await catalogueGuard(() => useDb().transaction(async (trx) => {
    const current = await trx('orchard_blocks').where({ id, org_id: orgId }).forUpdate().first('variety_id', 'rootstock_id')
    if (!current) notFound('That block')
    if (patch.varietyId !== undefined || patch.rootstockId !== undefined) {
      await checkCatalogue(trx, patch.varietyId ?? current.variety_id, patch.rootstockId ?? current.rootstock_id)
    }
    await trx('orchard_blocks').where({ id, org_id: orgId }).update({ ...toColumns(patch), updated_at: trx.fn.now(3) })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'block.updated', objectType: 'orchard_block', objectId: id, detail: { changed: Object.keys(patch).filter(k => patch[k as keyof BlockPatchInput] !== undefined) } })
  }))
}

export async function deleteBlock(orgId: number, actorId: number, id: number): Promise<void> {
  try {
    await useDb().transaction(async (trx) => {
      const block = await trx('orchard_blocks').where({ id, org_id: orgId }).forUpdate().first('name')
      if (!block) notFound('That block')
      await trx('orchard_blocks').where({ id, org_id: orgId }).delete()
      await recordAudit(trx, { orgId, actorUserId: actorId, action: 'block.deleted', objectType: 'orchard_block', objectId: id, detail: { name: block.name } })
    })
  }
  catch (e) {
    if (isDbError(e, ER_ROW_IS_REFERENCED)) throw createError({ statusCode: 409, message: 'Harvest lots or other records refer to this block, so it cannot be deleted.' })
    throw e
  }
}
