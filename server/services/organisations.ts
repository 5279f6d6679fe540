import type { Knex } from 'knex'
import { settingNotApplicable, type OrganisationPatchInput, type SettingsField } from '#shared/schemas/organisation'
import type { OrganisationSettings } from '#shared/types/organisation'
import { ORGANISATION_MOVES, type OrganisationAction, type OrganisationActor, type OrganisationState } from '#shared/utils/organisationStatus'
import { checkMove } from '#shared/utils/stateMachine'
import { findSettings, lockOrganisation, lockSettings, setOrganisationStatus, updateSettingsRow, type SettingsRow } from '../repositories/organisations'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { notFound } from '../utils/validation'
import { queueNoticeToOwners } from './notices'

// The state step every slice with states copies: in one transaction, lock the row, check the
// move against the pure table (409 with the current state), write, record the audit entry.

export interface OrganisationMoved { id: number, name: string, status: OrganisationState }

const AUDIT_ACTION: Record<OrganisationAction, string> = {
  confirm: 'organisation.confirmed', open: 'organisation.opened', suspend: 'organisation.suspended', reopen: 'organisation.opened',
}

// What the organisation's owners are told of a move the platform makes.
const OWNER_NOTICE: Partial<Record<OrganisationAction, (name: string) => { subject: string, body: string }>> = {
  suspend: name => ({
    subject: `${name} is suspended on Pomewright`,
    body: `The platform has suspended ${name}: its people cannot sign in until it is reopened. Its records are kept.`,
  }),
  reopen: name => ({
    subject: `${name} is open again on Pomewright`,
    body: `The platform has reopened ${name}: its people can sign in again, and its records are as they were.`,
  }),
}

/** Makes one move inside the caller's transaction (e-mail confirmation runs it inside its own). */
export async function moveOrganisationIn(
  trx: Knex.Transaction, actor: OrganisationActor & { userId: number }, id: number, action: OrganisationAction,
): Promise<OrganisationMoved> {
  const org = await lockOrganisation(trx, id)
  if (!org) notFound('That organisation')
  const move = checkMove(ORGANISATION_MOVES, action, org.status, actor, `${org.name}`)
  if (!move.ok) throw createError({ statusCode: move.statusCode, message: move.message, data: { state: move.state } })
  await setOrganisationStatus(trx, id, move.to)
  await recordAudit(trx, { orgId: id, actorUserId: actor.userId, action: AUDIT_ACTION[action], objectType: 'organisation', objectId: id, detail: { from: move.from, to: move.to } })
  const notice = OWNER_NOTICE[action]?.(org.name)
  if (notice) await queueNoticeToOwners(trx, id, { ...notice, kind: AUDIT_ACTION[action], link: '/' })
  return { id, name: org.name, status: move.to }
}

export function moveOrganisation(actor: OrganisationActor & { userId: number }, id: number, action: OrganisationAction): Promise<OrganisationMoved> {
  return useDb().transaction(trx => moveOrganisationIn(trx, actor, id, action))
}

/**
 * The admin's older form of the same moves (`PATCH { status }`): the move that leads from the
 * current state to the asked one, or no change when it is there already.
 */
export function setOrganisationStatusByAdmin(adminId: number, id: number, status: 'active' | 'suspended'): Promise<OrganisationMoved> {
  return useDb().transaction(async (trx) => {
    const org = await lockOrganisation(trx, id)
    if (!org) notFound('That organisation')
    if (org.status === status) return { id, name: org.name, status }
    const action = ORGANISATION_MOVES.find(m => m.to === status && m.from.includes(org.status) && m.allowed({ role: 'admin' }))?.action
    return moveOrganisationIn(trx, { role: 'admin', userId: adminId }, id, action ?? (status === 'active' ? 'reopen' : 'suspend'))
  })
}

// ----- Settings -----

/** The settings as the organisation's people read them: fields of another kind left out. */
function toSettings(row: SettingsRow): OrganisationSettings {
  const { pressType, defaultJuiceYieldLPerT, plantHealthRegNo, ...common } = row
  return {
    ...common,
    ...(settingNotApplicable('pressType', row) ? {} : { pressType, defaultJuiceYieldLPerT }),
    ...(settingNotApplicable('plantHealthRegNo', row) ? {} : { plantHealthRegNo }),
  }
}

export async function getSettings(orgId: number): Promise<OrganisationSettings> {
  const row = await findSettings(useDb(), orgId)
  if (!row) notFound('That organisation')
  return toSettings(row)
}

// Recorded with their values before and after; a long text is recorded only as changed.
const LONG_SETTINGS: SettingsField[] = ['description']

/**
 * Changes the settings in one transaction with the row locked: only the fields whose value differs
 * are written, and the audit entry names them with their values before and after.
 */
export function updateSettings(orgId: number, actorId: number, patch: OrganisationPatchInput): Promise<OrganisationSettings> {
  return useDb().transaction(async (trx) => {
    const current = await lockSettings(trx, orgId)
    if (!current) notFound('That organisation')
    const changes: Record<string, unknown> = {}
    for (const [field, value] of Object.entries(patch) as [SettingsField, unknown][]) {
      if (value !== undefined && value !== current[field]) changes[field] = value
    }
    const changed = Object.keys(changes) as SettingsField[]
    if (changed.length === 0) return toSettings(current)
    await updateSettingsRow(trx, orgId, changes)
    const small = changed.filter(field => !LONG_SETTINGS.includes(field))
    await recordAudit(trx, {
      orgId, actorUserId: actorId, action: 'organisation.settings_changed', objectType: 'organisation', objectId: orgId,
      detail: { changed, before: Object.fromEntries(small.map(f => [f, current[f]])), after: Object.fromEntries(small.map(f => [f, changes[f]])) },
    })
    return toSettings((await findSettings(trx, orgId))!)
  })
}
