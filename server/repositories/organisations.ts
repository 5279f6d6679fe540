import type { Knex } from 'knex'
import type { OrganisationPatchInput } from '#shared/schemas/organisation'
import type { OrganisationSettings } from '#shared/types/organisation'
import type { OrganisationState } from '#shared/utils/organisationStatus'
import { useDb, type Db } from '../utils/db'

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

// ----- Settings: the organisation's own row -----

/** The settings columns, as the API names them. */
const SETTINGS_COLUMNS = [
  'id', 'name', 'kind', 'isNursery', 'status', 'region', 'countryCode', 'description', 'contactName', 'contactPhone', 'publicEmail', 'contactEmail',
  'hemisphere', 'currency', 'taxRatePct', 'listed', 'hydrometerCalibrationC', 'pressType', 'defaultJuiceYieldLPerT', 'plantHealthRegNo',
  'paymentAccountId', 'createdAt', 'updatedAt',
]

/** Every settings field, the ones that do not apply to the organisation's kind too. */
export type SettingsRow = Required<OrganisationSettings>

export function findSettings(db: Db, orgId: number): Promise<SettingsRow | undefined> {
  return db('organisations').where({ id: orgId }).first(SETTINGS_COLUMNS)
}

/** The organisation's settings, locked until the transaction ends, or undefined. */
export function lockSettings(trx: Knex.Transaction, orgId: number): Promise<SettingsRow | undefined> {
  return trx('organisations').where({ id: orgId }).forUpdate().first(SETTINGS_COLUMNS)
}

/** The account on the payment processor the organisation is paid into. */
export async function setPaymentAccount(trx: Knex.Transaction, orgId: number, paymentAccountId: string): Promise<void> {
  await trx('organisations').where({ id: orgId }).update({ paymentAccountId, updatedAt: trx.fn.now(3) })
}

export async function updateSettingsRow(trx: Knex.Transaction, orgId: number, changes: OrganisationPatchInput): Promise<void> {
  await trx('organisations').where({ id: orgId }).update({ ...changes, updatedAt: trx.fn.now(3) })
}
