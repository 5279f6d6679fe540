import type { BlockCreateInput, BlockPatchInput } from '#shared/schemas/block'
import type { BlockWithoutCurve, OrchardBlockDetail, OrganisationForecast } from '#shared/types/block'
import { forecastBlock, sumForecastByClass, type ClassedBlock, type YearKg } from '#shared/utils/forecast'
import { allBlocks, deleteBlockRow, findBlock, insertBlock, lockBlock, toBlock, updateBlockRow, type BlockRow } from '../repositories/blocks'
import { recordAudit } from '../utils/audit'
import { bearingCurveOf } from '../utils/bearingCurve'
import { useDb, withDbRefusals, type DbRefusals } from '../utils/db'
import { notFound } from '../utils/validation'
import { checkCatalogue } from './catalogue'

// Orchard blocks: each write is one transaction that checks the catalogue, writes and records
// the audit entry; reads add the forecast on the rootstock's bearing curve.

const curveOf = (row: BlockRow) => bearingCurveOf({ ...row, designation: row.rootstockDesignation }, row.bearingPace)

function zeros(startYear: number, years: number): YearKg[] {
  return Array.from({ length: years }, (_, i) => ({ year: startYear + i, kg: 0 }))
}

/** One block with its yearly forecast; another organisation's block is simply not found (404). */
export async function getBlock(orgId: number, id: number, span: { startYear: number, years: number }): Promise<OrchardBlockDetail> {
  const row = await findBlock(useDb(), orgId, id)
  if (!row) notFound('That block')
  const block = toBlock(row)
  const { curve, note } = curveOf(row)
  return {
    ...block,
    bearingCurve: curve,
    forecastNote: note,
    forecast: curve ? forecastBlock({ trees: block.treeCount, yearPlanted: block.yearPlanted, survivalRate: block.survivalRate }, curve, span) : zeros(span.startYear, span.years),
  }
}

/** The organisation's forecast kg per juice class and year, from every block with a bearing curve. */
export async function organisationForecast(orgId: number, span: { startYear: number, years: number }): Promise<OrganisationForecast> {
  const classed: ClassedBlock[] = []
  const blocksWithoutCurve: BlockWithoutCurve[] = []
  for (const row of await allBlocks(orgId)) {
    const { curve, note } = curveOf(row)
    if (curve) classed.push({ trees: row.treeCount, yearPlanted: row.yearPlanted, survivalRate: row.survivalRate, species: row.species, juiceClass: row.juiceClass, curve })
    else blocksWithoutCurve.push({ id: row.id, name: row.name, rootstockDesignation: row.rootstockDesignation, note })
  }
  const byClass = sumForecastByClass(classed, span)
  const years = zeros(span.startYear, span.years)
  const totals = years.map(({ year }, i) => ({ year, kg: Object.values(byClass).reduce((sum, rows) => sum + rows[i]!.kg, 0) }))
  return { startYear: span.startYear, years: years.map(y => y.year), byClass, totals, blocksWithoutCurve }
}

// A catalogue row deleted between the check and the write still answers 400, not 500.
const REFUSALS: DbRefusals = {
  missingReference: { field: 'varietyId', message: 'The variety or rootstock is no longer in the catalogue' },
  inUse: { message: 'Harvest lots or other records refer to this block, so it cannot be deleted.' },
}

// Round to the columns' scale, so a value converted from acres or feet is stored as shown.
const SCALE: Partial<Record<keyof BlockCreateInput, number>> = { areaHa: 3, inRowM: 2, betweenRowM: 2, survivalRate: 3 }

function toScale<T extends BlockPatchInput>(input: T): T {
  const out: Record<string, unknown> = {}
  for (const [key, value] of Object.entries(input)) {
    if (value === undefined) continue
    const places = SCALE[key as keyof BlockCreateInput]
    out[key] = typeof value === 'number' && places !== undefined ? Number(value.toFixed(places)) : value
  }
  return out as T
}

export function createBlock(orgId: number, actorId: number, input: BlockCreateInput): Promise<number> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    await checkCatalogue(trx, input.varietyId, input.rootstockId)
    const id = await insertBlock(trx, orgId, toScale(input))
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'block.created', objectType: 'orchard_block', objectId: id, detail: { name: input.name, treeCount: input.treeCount } })
    return id
  }))
}

export function updateBlock(orgId: number, actorId: number, id: number, patch: BlockPatchInput): Promise<void> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const current = await lockBlock(trx, orgId, id)
    if (!current) notFound('That block')
    if (patch.varietyId !== undefined || patch.rootstockId !== undefined) {
      await checkCatalogue(trx, patch.varietyId ?? current.varietyId, patch.rootstockId ?? current.rootstockId)
    }
    const changes = toScale(patch)
    await updateBlockRow(trx, orgId, id, changes)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'block.updated', objectType: 'orchard_block', objectId: id, detail: { changed: Object.keys(changes) } })
  }))
}

export function deleteBlock(orgId: number, actorId: number, id: number): Promise<void> {
  return withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    const block = await lockBlock(trx, orgId, id)
    if (!block) notFound('That block')
    await deleteBlockRow(trx, orgId, id)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'block.deleted', objectType: 'orchard_block', objectId: id, detail: { name: block.name } })
  }))
}
