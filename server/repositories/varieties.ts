import type { VarietyListQuery } from '#shared/schemas/catalogue'
import type { Variety, VarietyList } from '#shared/types/catalogue'
import { useDb, type Db } from '../utils/db'
import { notFound } from '../utils/validation'
import { findCatalogueRow, listCatalogueRows, type CatalogueTable } from './catalogue'

export const VARIETIES: CatalogueTable = { table: 'varieties', noun: 'variety', nameField: 'name' }

export function listVarieties(query: VarietyListQuery): Promise<VarietyList> {
  const filters = { species: query.species, juiceClass: query.juiceClass }
  return listCatalogueRows<Variety>(VARIETIES, query, filters, [{ column: 'species' }, { column: 'name' }, { column: 'id' }])
}

export async function getVariety(id: number, db: Db = useDb()): Promise<Variety> {
  const variety = await findCatalogueRow<Variety>(db, VARIETIES, id)
  if (!variety) notFound('That variety')
  return variety
}
