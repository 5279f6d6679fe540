import type { VarietyCreateInput, VarietyListQuery, VarietyPatchInput } from '../../shared/schemas/catalogue'
import type { Variety, VarietyList } from '../../shared/types/catalogue'
import { createCatalogueRow, deleteCatalogueRow, findCatalogueRow, listCatalogueRows, numberOrNull, updateCatalogueRow, type CatalogueTable } from '../utils/catalogue'
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

function toVariety(r: Row): Variety {
  return {
    id: r.id,
    name: r.name,
    species: r.species,
    juiceClass: r.juice_class,
    typicalBrix: numberOrNull(r.typical_brix),
    typicalTaGPerL: numberOrNull(r.typical_ta_g_per_l),
    typicalTanninGPerL: numberOrNull(r.typical_tannin_g_per_l),
    harvestSeason: r.harvest_season,
    source: r.source,
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
  }
}

const VARIETIES: CatalogueTable<Row, Variety> = {
  table: 'varieties',
  noun: 'variety',
  nameField: 'name',
  columns: COLUMNS,
  toItem: toVariety,
  taken: name => `A variety named "${name}" is already in the catalogue`,
}

export function listVarieties(query: VarietyListQuery): Promise<VarietyList> {
  const filters = { species: query.species, juice_class: query.juiceClass }
  return listCatalogueRows(VARIETIES, query, filters, [{ column: 'species' }, { column: 'name' }, { column: 'id' }])
}

export function getVariety(id: number): Promise<Variety> {
  return findCatalogueRow(useDb(), VARIETIES, id)
}

export function createVariety(actorId: number, input: VarietyCreateInput): Promise<Variety> {
  return createCatalogueRow(VARIETIES, actorId, input)
}

export function updateVariety(actorId: number, id: number, patch: VarietyPatchInput): Promise<Variety> {
  return updateCatalogueRow(VARIETIES, actorId, id, patch)
}

export function deleteVariety(actorId: number, id: number): Promise<void> {
  return deleteCatalogueRow(VARIETIES, actorId, id)
}
