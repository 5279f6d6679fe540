import { useDb } from '../utils/db'

interface OrganisationRow { id: number, name: string, kind: string, is_nursery: boolean, region: string | null, status: string, created_at: Date, members: number }

/** The platform admin's view: organisations and how many people each has, none of their records. */
export async function listOrganisations(page: { limit: number, offset: number }) {
  const db = useDb()
  const rows = await db('organisations as o')
    .leftJoin('users as u', q => q.on('u.org_id', 'o.id').andOnVal('u.active', true))
    .select('o.id', 'o.name', 'o.kind', 'o.is_nursery', 'o.region', 'o.status', 'o.created_at')
    .count({ members: 'u.id' })
    .groupBy('o.id').orderBy('o.name').limit(page.limit).offset(page.offset) as unknown as OrganisationRow[]
  const [{ total }] = await db('organisations').count({ total: '*' }) as [{ total: number }]
  return {
    items: rows.map(r => ({ id: r.id, name: r.name, kind: r.kind, isNursery: r.is_nursery, region: r.region, status: r.status, members: Number(r.members), createdAt: r.created_at })),
    total: Number(total),
  }
}
