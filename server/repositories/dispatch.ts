import type { PassportSpecies } from '#shared/utils/plantPassport'
import type { Db } from '../utils/db'

// What the dispatch labels read besides the contract, its runs and their events (the contract and
// nursery repositories): the species of the varieties the runs were worked with, for the passport's
// botanical name. The catalogue is shared, so no organisation scopes it.

export async function speciesOfVarieties(db: Db, ids: number[]): Promise<Map<number, PassportSpecies>> {
  if (!ids.length) return new Map()
  const rows = await db('varieties').whereIn('id', [...new Set(ids)]).select('id', 'species') as { id: number, species: PassportSpecies }[]
  return new Map(rows.map(r => [r.id, r.species]))
}
