import type { Knex } from 'knex'
import type { DirectoryQuery } from '#shared/schemas/organisation'
import type { JuiceClass } from '#shared/utils/juiceClass'
import { useDb, type Db } from '../utils/db'
import { containsPattern, whereNameContains } from './catalogue'

// The directory's queries: listed, active organisations, and what their orchard blocks grow.
// Only these columns leave the organisations table here, so nothing else of anyone's is shown.

const ENTRY_COLUMNS = ['o.id', 'o.name', 'o.kind', 'o.isNursery', 'o.region', 'o.description']

export interface DirectoryRow { id: number, name: string, kind: 'grower' | 'maker', isNursery: boolean, region: string | null, description: string | null }
export interface GrownRow { orgId: number, id: number, name: string, species: 'apple' | 'pear', juiceClass: JuiceClass }

function listed(db: Db) {
  return db('organisations as o').where({ 'o.listed': true, 'o.status': 'active' })
}

/** The blocks of the organisation in the outer query, with their varieties, for `whereExists`. */
function blocksOfOuter(db: Db) {
  return db('orchardBlocks as b').join('varieties as v', 'v.id', 'b.varietyId').where('b.orgId', db.ref('o.id')).select(db.raw('1'))
}

/** Organisations with a block of the variety (a catalogue id, or part of its name). */
function whereGrowsVariety(db: Db, query: Knex.QueryBuilder, variety: string): void {
  query.whereExists(blocksOfOuter(db)
    .where((q: Knex.QueryBuilder) => {
      if (/^\d+$/.test(variety)) q.where('v.id', Number(variety)).orWhere('v.name', 'like', containsPattern(variety))
      else whereNameContains(q, 'v.name', variety)
    }))
}

/** Organisations with a block of the class ("perry …" for perry pears, kept apart from apples). */
function whereGrowsClass(db: Db, query: Knex.QueryBuilder, forecastClass: string): void {
  const species = forecastClass.startsWith('perry ') ? 'pear' : 'apple'
  const juiceClass = forecastClass.replace(/^perry /, '')
  query.whereExists(blocksOfOuter(db)
    .where({ 'v.species': species, 'v.juiceClass': juiceClass }))
}

/** One page of the listed organisations that match every filter given, by name, and how many match. */
export async function listDirectoryRows(query: DirectoryQuery): Promise<{ rows: DirectoryRow[], total: number }> {
  const db = useDb()
  const base = listed(db).modify((q) => {
    if (query.q) whereNameContains(q, 'o.name', query.q)
    if (query.region) q.where('o.region', 'like', containsPattern(query.region))
    if (query.kind) q.where('o.kind', query.kind)
    if (query.nursery !== undefined) q.where('o.isNursery', query.nursery)
    if (query.variety) whereGrowsVariety(db, q, query.variety)
    if (query.juiceClass) whereGrowsClass(db, q, query.juiceClass)
  })
  const [rows, [{ total }]] = await Promise.all([
    base.clone().select(ENTRY_COLUMNS).orderBy([{ column: 'o.name' }, { column: 'o.id' }]).limit(query.limit).offset(query.offset) as Promise<DirectoryRow[]>,
    base.clone().count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { rows, total }
}

/** A listed organisation, or the viewer's own listed or not; undefined for anyone else's. */
export function findDirectoryRow(id: number, viewerOrgId: number | null): Promise<DirectoryRow | undefined> {
  const db = useDb()
  return db('organisations as o').where('o.id', id)
    .where((q) => {
      q.where({ 'o.listed': true, 'o.status': 'active' })
      if (viewerOrgId !== null) q.orWhere('o.id', viewerOrgId)
    })
    .first(ENTRY_COLUMNS)
}

/** The distinct varieties the organisations' blocks grow, by name. */
export function grownBy(orgIds: number[]): Promise<GrownRow[]> {
  if (orgIds.length === 0) return Promise.resolve([])
  return useDb()('orchardBlocks as b').join('varieties as v', 'v.id', 'b.varietyId')
    .whereIn('b.orgId', orgIds)
    .distinct('b.orgId', 'v.id', 'v.name', 'v.species', 'v.juiceClass')
    .orderBy([{ column: 'v.name' }, { column: 'v.id' }]) as Promise<GrownRow[]>
}
