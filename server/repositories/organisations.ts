import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { notFound } from '../utils/validation'

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

/** Opens or suspends an organisation (a suspended one's people fail every check at once). */
export async function setOrganisationStatus(adminId: number, id: number, status: 'active' | 'suspended') {
  return useDb().transaction(async (trx) => {
    const org = await trx('organisations').where({ id }).forUpdate().first('id', 'name', 'status')
    if (!org) notFound('That organisation')
    await trx('organisations').where({ id }).update({ status, updated_at: trx.fn.now(3) })
    await recordAudit(trx, { orgId: id, actorUserId: adminId, action: `organisation.${status === 'active' ? 'opened' : 'suspended'}`, objectType: 'organisation', objectId: id, detail: { from: org.status, to: status } })
    return { id, name: org.name as string, status }
  })
}
