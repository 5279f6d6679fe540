import type { Knex } from 'knex'
import type { OrganisationState } from '#shared/utils/organisationStatus'
import { useDb } from '../utils/db'

export interface OrganisationSummary {
  id: number
  name: string
  kind: string
  isNursery: boolean
  region: string | null
  status: OrganisationState
  members: number
  createdAt: string
}

/** The platform admin's view: organisations and how many people each has, none of their records. */
export async function listOrganisations(page: { limit: number, offset: number }): Promise<{ items: OrganisationSummary[], total: number }> {
  const db = useDb()
  const [items, [{ total }]] = await Promise.all([
    db('organisations as o')
      .leftJoin('users as u', q => q.on('u.orgId', 'o.id').andOnVal('u.active', true))
      .select('o.id', 'o.name', 'o.kind', 'o.isNursery', 'o.region', 'o.status', 'o.createdAt')
      .count({ members: 'u.id' })
      .groupBy('o.id').orderBy('o.name').limit(page.limit).offset(page.offset) as unknown as Promise<OrganisationSummary[]>,
    db('organisations').count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { items, total }
}

/** An organisation's status, locked until the transaction ends, or undefined. */
export function lockOrganisation(trx: Knex.Transaction, id: number): Promise<{ id: number, name: string, status: OrganisationState } | undefined> {
  return trx('organisations').where({ id }).forUpdate().first('id', 'name', 'status')
}

export async function setOrganisationStatus(trx: Knex.Transaction, id: number, status: OrganisationState): Promise<void> {
  await trx('organisations').where({ id }).update({ status, updatedAt: trx.fn.now(3) })
}
