import type { Knex } from 'knex'
import type { SessionUser } from '#shared/types/auth'
import type { ContractHistory, ContractMoveOption } from '#shared/types/contract'
import { checkContractMove, contractMovesFrom, isExpired, type ContractActor, type ContractKind, type PartyActor } from '#shared/utils/contractStatus'
import { insertContractEvent, listContractEvents, lockContractRow, writerIds, type ContractParties } from '../repositories/contracts'
import { recordAudit } from '../utils/audit'
import { transactionRetried, useDb } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'
import { queueNotice } from './notices'

// What tree and fruit contracts share: finding the caller's side, checking a move against the
// pure table under the row lock (403 for a move the person may never make, 409 with the current
// state otherwise), the history entry with what changed, and the notice to the other side. Each
// kind's service says what its terms are and how a move changes them.

export type Member = SessionUser & { orgId: number }

/** The columns every contract row has, whatever its kind. */
export interface ContractRowBase {
  id: number
  state: string
  version: number
  acceptedVersion: number | null
  draftedBy: string
  lastOfferBy: string | null
  cancelledBy: string | null
  expiresOn: string | null
  expiryNoticedVersion: number | null
}

export function today(): string {
  return new Date().toISOString().slice(0, 10)
}

/** A DATE column as YYYY-MM-DD (the driver hands DATE over as text already). */
export function dateOnly(value: string | null): string | null {
  return value === null ? null : value.slice(0, 10)
}

export function sideOf<Side extends string>(parties: ContractParties<Side>, row: Record<string, unknown>, orgId: number): Side {
  const found = parties.sides.find(s => row[s.column] === orgId)
  if (!found) throw new Error('the organisation is not a party to this contract')
  return found.side
}

export function otherSide<Side extends string>(parties: ContractParties<Side>, side: Side): { side: Side, column: string } {
  return parties.sides.find(s => s.side !== side)!
}

export function actorOf<Side extends string>(user: Member, side: Side, row: ContractRowBase): PartyActor<Side> {
  return { role: user.role as PartyActor<Side>['role'], side, draftedBy: row.draftedBy as Side, lastOfferBy: row.lastOfferBy as Side | null }
}

/** The moves the page shows this person now, and whose turn the standing offer is. */
export function movesFor<Side extends string>(kind: ContractKind, user: Member, side: Side, row: ContractRowBase) {
  const actor = actorOf(user, side, row)
  const position = { state: row.state, expiresOn: dateOnly(row.expiresOn) }
  const moves = (contractMovesFrom as (k: ContractKind, c: typeof position, a: ContractActor<Side>, t: string) => { action: string, label: string }[])(kind, position, actor, today())
  const open = row.state === 'offered' || row.state === 'countered'
  const offeredBy = row.lastOfferBy ?? row.draftedBy
  return {
    moves: moves.map(({ action, label }) => ({ action, label })) as ContractMoveOption<never>[],
    awaiting: open ? (offeredBy === side ? 'them' as const : 'you' as const) : null,
    expired: open && isExpired({ expiresOn: position.expiresOn }, today()),
  }
}

/** A contract's history for the caller, who may see it: the side that did not draft it reads from the first offer on. */
export function historyFor<Side extends string>(parties: ContractParties<Side>, user: Member, row: ContractRowBase, page: { limit: number, offset: number }): Promise<ContractHistory> {
  const drafter = sideOf(parties, row as unknown as Record<string, unknown>, user.orgId) === row.draftedBy
  return listContractEvents(useDb(), parties.kind, row.id, page, drafter ? 0 : 1)
}

/** The change list between two sets of terms: each field whose value differs, before and after. */
export function termChanges(before: Record<string, unknown>, after: Record<string, unknown>): { field: string, from: unknown, to: unknown }[] {
  const changes: { field: string, from: unknown, to: unknown }[] = []
  for (const field of Object.keys(after)) {
    if (JSON.stringify(before[field] ?? null) !== JSON.stringify(after[field] ?? null)) changes.push({ field, from: before[field] ?? null, to: after[field] ?? null })
  }
  return changes
}

/** An offer may not stand on a last day already past. */
export function checkExpiryAhead(expiresOn: string | null | undefined): void {
  if (expiresOn && expiresOn < today()) {
    throw fieldError([{ path: 'expiresOn', message: `The offer's last day (${expiresOn}) has passed: give today or a later day, or leave it empty` }])
  }
}

export interface MoveContext<Row, Side extends string> {
  trx: Knex.Transaction
  row: Row
  side: Side
  user: Member
  /** The state the table moves the contract to. */
  to: string
}

/** What a move writes, besides the state: columns, and what the history records. */
export interface MoveEffect {
  columns?: Record<string, unknown>
  changes?: { field: string, from: unknown, to: unknown }[]
  /** The whole terms of the version the move makes (offers and counters). */
  terms?: Record<string, unknown> | null
  /** Whether the version goes up by one (offers and counters). */
  newVersion?: boolean
  reason?: string | null
}

export interface ContractKindService<Row extends ContractRowBase, Side extends string> {
  parties: ContractParties<Side>
  /** "tree contract" */
  noun: string
  /** The page of one contract, for links in notices. */
  link: (id: number) => string
  /** Says what the contract is for, in a few words: "1,200 Dabinett on MM.106". */
  describe: (trx: Knex.Transaction, row: Row) => Promise<string>
}

const ACTION_EVENT: Record<string, string> = {
  'edit': 'edited', 'offer': 'offered', 'counter': 'countered', 'accept': 'accepted', 'decline': 'declined', 'cancel': 'cancelled',
  'start-propagation': 'propagation-started', 'mark-ready': 'marked-ready', 'deliver': 'delivered', 'fulfil': 'fulfilled',
}

// What the other side reads of each move, after the acting organisation's name.
const NOTICE_VERB: Record<string, string> = {
  'offer': 'sent you an offer', 'counter': 'made a counter-offer', 'accept': 'accepted', 'decline': 'declined',
  'cancel': 'cancelled', 'start-propagation': 'started propagating the trees of', 'mark-ready': 'has the trees ready for', 'deliver': 'recorded the delivery of',
}

async function orgName(trx: Knex.Transaction, id: number): Promise<string> {
  const row = await trx('organisations').where({ id }).first('name') as { name: string } | undefined
  return row?.name ?? 'The other party'
}

/** Tells the owners and members of `orgId` (never the person who acted), inside the move's transaction. */
export async function tellParty(trx: Knex.Transaction, orgId: number, exceptUserId: number | null, notice: { subject: string, body: string, link: string, kind: string }): Promise<void> {
  const recipients = (await writerIds(trx, orgId)).filter(id => id !== exceptUserId)
  if (recipients.length) await queueNotice(trx, { ...notice, orgId, recipients })
}

/**
 * Makes one move in one transaction: locks the row the caller may see (404 otherwise), checks the
 * move (403/409), lets `effect` check and say what else changes, writes, records the history and
 * the audit entry, and tells the other side.
 */
export async function moveContract<Row extends ContractRowBase, Side extends string>(
  service: ContractKindService<Row, Side>,
  user: Member,
  id: number,
  action: string,
  effect: (ctx: MoveContext<Row, Side>) => Promise<MoveEffect> | MoveEffect,
): Promise<void> {
  const { parties } = service
  await transactionRetried(async (trx) => {
    const row = await lockContractRow<Row>(trx, parties, user.orgId, id)
    if (!row) notFound(`That ${service.noun}`)
    const side = sideOf(parties, row as unknown as Record<string, unknown>, user.orgId)
    const check = (checkContractMove as (k: ContractKind, a: string, c: { state: string, expiresOn: string | null }, actor: ContractActor<Side>, t: string) => ReturnType<typeof checkContractMove>)(
      parties.kind, action, { state: row.state, expiresOn: dateOnly(row.expiresOn) }, actorOf(user, side, row), today(),
    )
    if (!check.ok) throw createError({ statusCode: check.statusCode, message: check.message, data: { state: check.state, version: row.version } })
    const done = await effect({ trx, row, side, user, to: check.to })
    const version = done.newVersion ? row.version + 1 : row.version
    const columns: Record<string, unknown> = { ...done.columns, state: check.to, version, updatedAt: trx.fn.now(3) }
    if (action === 'offer' || action === 'counter') columns.lastOfferBy = side
    await trx(parties.table).where({ id }).update(columns)
    await insertContractEvent(trx, {
      contractKind: parties.kind, contractId: id, action: ACTION_EVENT[action] ?? action, version,
      byUserId: user.id, byOrgId: user.orgId, byName: user.name, changes: done.changes ?? [], terms: done.terms ?? null, reason: done.reason ?? null,
    })
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: `${parties.kind}_contract.${ACTION_EVENT[action] ?? action}`, objectType: `${parties.kind}_contract`, objectId: id, detail: { from: row.state, to: check.to, version } })
    // The other side never saw a draft, so a draft's edits and its discarding are not news to it.
    if (row.state === 'draft' && action !== 'offer') return
    const verb = NOTICE_VERB[action]
    if (!verb) return
    const other = otherSide(parties, side)
    const what = await service.describe(trx, row)
    const actorOrg = await orgName(trx, user.orgId)
    const reason = done.reason ? `\n\nTheir note: ${done.reason}` : ''
    await tellParty(trx, (row as unknown as Record<string, number>)[other.column]!, user.id, {
      subject: `${actorOrg} ${verb} ${action === 'offer' || action === 'counter' ? `for ${what}` : `the ${service.noun} for ${what}`}`,
      body: `${user.name} of ${actorOrg} ${verb} ${action === 'offer' || action === 'counter' ? 'for' : `the ${service.noun} for`} ${what} (version ${version}).${reason}`,
      link: service.link(id),
      kind: `${parties.kind}_contract.${ACTION_EVENT[action] ?? action}`,
    })
  })
}

/** The check `POST …/accept { version }` makes first: the terms the person read must be the ones standing. */
export function checkAcceptedVersion(row: ContractRowBase, version: number): void {
  if (row.version !== version) {
    throw createError({
      statusCode: 409,
      message: `The terms changed since you read them: version ${row.version} stands now, not ${version}. Read it before you accept.`,
      data: { state: row.state, version: row.version },
    })
  }
}

/** Records a move Pomewright makes itself (an offer's expiry, a contract fulfilled) and tells both sides. */
export async function systemEvent<Side extends string>(
  trx: Knex.Transaction, service: ContractKindService<ContractRowBase, Side>, row: ContractRowBase & Record<string, unknown>, action: 'expired' | 'fulfilled', notice: { subject: string, body: string },
): Promise<void> {
  const { parties } = service
  await insertContractEvent(trx, { contractKind: parties.kind, contractId: row.id, action, version: row.version, byUserId: null, byOrgId: null, byName: 'Pomewright', changes: [] })
  for (const { column } of parties.sides) {
    await tellParty(trx, row[column] as number, null, { ...notice, link: service.link(row.id), kind: `${parties.kind}_contract.${action}` })
  }
}
