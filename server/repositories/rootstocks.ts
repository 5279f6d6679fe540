import type { RootstockListQuery } from '#shared/schemas/catalogue'
import type { Rootstock, RootstockList } from '#shared/types/catalogue'
import { useDb, type Db } from '../utils/db'
import { notFound } from '../utils/validation'
import { findCatalogueRow, listCatalogueRows, type CatalogueTable } from './catalogue'

export const ROOTSTOCKS: CatalogueTable = { table: 'rootstocks', noun: 'rootstock', nameField: 'designation' }

export function listRootstocks(query: RootstockListQuery): Promise<RootstockList> {
  const filters = { species: query.species, vigour: query.vigour }
  // Apple before pear, then from the most dwarfing stock to seedling.
  const order = [{ column: 'species' }, { column: 'sizePctOfSeedling' }, { column: 'designation' }, { column: 'id' }]
  return listCatalogueRows<Rootstock>(ROOTSTOCKS, query, filters, order)
}

export async function getRootstock(id: number, db: Db = useDb()): Promise<Rootstock> {
  const rootstock = await findCatalogueRow<Rootstock>(db, ROOTSTOCKS, id)
  if (!rootstock) notFound('That rootstock')
  return rootstock
}
