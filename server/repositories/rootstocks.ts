import { bearingYearsIssue, type RootstockCreateInput, type RootstockListQuery, type RootstockPatchInput } from '../../shared/schemas/catalogue'
import type { Rootstock, RootstockList } from '../../shared/types/catalogue'
import { createCatalogueRow, deleteCatalogueRow, findCatalogueRow, listCatalogueRows, numberOrNull, updateCatalogueRow, type CatalogueTable } from '../utils/catalogue'
import { useDb } from '../utils/db'
import { fieldError } from '../utils/validation'

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

function toRootstock(r: Row): Rootstock {
  return {
    id: r.id,
    designation: r.designation,
    species: r.species,
    vigour: r.vigour,
    sizePctOfSeedling: numberOrNull(r.size_pct_of_seedling),
    needsSupport: Boolean(r.needs_support),
    inRowM: numberOrNull(r.in_row_m),
    betweenRowM: numberOrNull(r.between_row_m),
    yearsToFirstCrop: numberOrNull(r.years_to_first_crop),
    yearsToFullBearing: numberOrNull(r.years_to_full_bearing),
    yieldPerTreeKg: numberOrNull(r.yield_per_tree_kg),
    source: r.source,
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
  }
}

const ROOTSTOCKS: CatalogueTable<Row, Rootstock> = {
  table: 'rootstocks',
  noun: 'rootstock',
  nameField: 'designation',
  columns: COLUMNS,
  toItem: toRootstock,
  taken: designation => `A rootstock designated "${designation}" is already in the catalogue`,
}

export function listRootstocks(query: RootstockListQuery): Promise<RootstockList> {
  const filters = { species: query.species, vigour: query.vigour }
  // Apple before pear, then from the most dwarfing stock to seedling.
  const order = [{ column: 'species' }, { column: 'size_pct_of_seedling' }, { column: 'designation' }, { column: 'id' }]
  return listCatalogueRows(ROOTSTOCKS, query, filters, order)
}

export function getRootstock(id: number): Promise<Rootstock> {
  return findCatalogueRow(useDb(), ROOTSTOCKS, id)
}

export function createRootstock(actorId: number, input: RootstockCreateInput): Promise<Rootstock> {
  return createCatalogueRow(ROOTSTOCKS, actorId, input)
}

export function updateRootstock(actorId: number, id: number, patch: RootstockPatchInput): Promise<Rootstock> {
  return updateCatalogueRow(ROOTSTOCKS, actorId, id, patch, (current) => {
    // A patch of one bearing figure must still agree with the stored other one.
    const issue = bearingYearsIssue(
      patch.yearsToFirstCrop !== undefined ? patch.yearsToFirstCrop : numberOrNull(current.years_to_first_crop),
      patch.yearsToFullBearing !== undefined ? patch.yearsToFullBearing : numberOrNull(current.years_to_full_bearing),
    )
    if (issue) {
      const path = patch.yearsToFullBearing !== undefined ? 'yearsToFullBearing' : 'yearsToFirstCrop'
      throw fieldError([{ path, message: issue }])
    }
  })
}

export function deleteRootstock(actorId: number, id: number): Promise<void> {
  return deleteCatalogueRow(ROOTSTOCKS, actorId, id)
}
