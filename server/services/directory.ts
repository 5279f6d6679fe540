import type { DirectoryQuery } from '#shared/schemas/organisation'
import type { DirectoryEntry, DirectoryList } from '#shared/types/organisation'
import { FORECAST_CLASSES, forecastClassOf, type ForecastClass } from '#shared/utils/forecast'
import { findDirectoryRow, grownBy, listDirectoryRows, type DirectoryRow, type GrownRow } from '../repositories/directory'
import { notFound } from '../utils/validation'

// The directory: who each listed organisation is and what it grows, so makers can find growers and
// nurseries. Built from the directory rows and the distinct varieties of their blocks; no counts,
// areas, contracts, lots or e-mail addresses.

function toEntries(rows: DirectoryRow[], grown: GrownRow[]): DirectoryEntry[] {
  return rows.map((row) => {
    const own = grown.filter(g => g.orgId === row.id)
    const classes = new Set<ForecastClass>(own.map(g => forecastClassOf(g.species, g.juiceClass)))
    return {
      id: row.id,
      name: row.name,
      kind: row.kind,
      isNursery: row.isNursery,
      region: row.region,
      description: row.description,
      varieties: own.map(({ id, name, species }) => ({ id, name, species })),
      juiceClasses: FORECAST_CLASSES.filter(c => classes.has(c)),
      // Filled once nursery runs record what each nursery propagates.
      propagates: [],
    }
  })
}

export async function listDirectory(query: DirectoryQuery): Promise<DirectoryList> {
  const { rows, total } = await listDirectoryRows(query)
  return { items: toEntries(rows, await grownBy(rows.map(r => r.id))), total }
}

/** A listed organisation, or the caller's own; any other answers 404, listed elsewhere or not. */
export async function getDirectoryEntry(id: number, viewerOrgId: number | null): Promise<DirectoryEntry> {
  const row = await findDirectoryRow(id, viewerOrgId)
  if (!row) notFound('That organisation')
  return toEntries([row], await grownBy([row.id]))[0]!
}
