import type { Knex } from 'knex'
import { blendSolveSchema, type BlendSolveInput } from '#shared/schemas/blend'
import type { BlendPlanCreateInput, BlendPlanListQuery, BlendPlanPatchInput, PressingInput } from '#shared/schemas/blendPlan'
import type { SessionUser } from '#shared/types/auth'
import type { BlendSolveResponse } from '#shared/types/blend'
import type { BlendPlan, BlendPlanAction, BlendPlanList, BlendPlanSummary, LotTrace, Pressing, PressingTrace } from '#shared/types/blendPlan'
import { blendPlanMovesFrom, checkBlendPlanMove, type BlendPlanActor } from '#shared/utils/blendPlanStatus'
import {
  deletePlanRow, findPlanRow, findPressing, insertPlan, insertPlanEvent, insertPressing, insertReservations, listPlanEvents, listPlanRows,
  lockLots, lockPlan, lotOwner, lotTraceForGrower, lotTraceForMaker, planLots, pressableKg, pressingOfPlan, pressingSources, setLotsPressed,
  updatePlanRow, type BlendPlanRow,
} from '../repositories/blendPlans'
import { blendLotRowsByIds } from '../repositories/blends'
import { lotIdsVisibleTo } from '../repositories/lots'
import { recordAudit } from '../utils/audit'
import { transactionRetried, useDb } from '../utils/db'
import { fieldError, notFound, validate } from '../utils/validation'
import { solveBlendFor } from './blends'

// A maker's blend plans: a draft keeps a solve's question and answer; its commit solves again on
// what is free now and reserves the plan's kilograms of each lot; a committed plan is released
// (the kilograms free again) or pressed (what was actually taken leaves the lots). Every write is
// one transaction that locks the plan, and a commit or pressing then locks the plan's lots in the
// order of their ids and reads what is free under those locks, read committed, so it sees every
// reservation committed before it got them: two commits over one lot take turns, and the second
// solves on what the first left.

type Member = SessionUser & { orgId: number }

const actorOf = (user: Member): BlendPlanActor => ({ role: user.role as BlendPlanActor['role'] })
const kg1 = (value: number) => Math.round(value * 10) / 10
const kgText = (value: number) => `${kg1(value).toLocaleString('en-GB')} kg`

/** A commit's and a pressing's transaction: free kilograms are read as committed, under the lots' locks. */
const lockedWork = <T>(work: (trx: Knex.Transaction) => Promise<T>) => transactionRetried(work, 3, { isolationLevel: 'read committed' })

function summaryOf(row: BlendPlanRow): BlendPlanSummary {
  return {
    id: row.id, name: row.name, state: row.state, status: row.result.status, volumeL: row.request.volumeL, cost: row.result.cost,
    currency: row.result.currency, lotCount: row.request.lots.length, version: row.version,
    committedAt: row.committedAt ? new Date(row.committedAt).toISOString() : null,
    pressedAt: row.pressedAt ? new Date(row.pressedAt).toISOString() : null,
    createdAt: new Date(row.createdAt).toISOString(), updatedAt: new Date(row.updatedAt).toISOString(),
  }
}

function checked(user: Member, row: BlendPlanRow | undefined, action: BlendPlanAction): BlendPlanRow {
  if (!row) notFound('That plan')
  const check = checkBlendPlanMove(action, row.state, actorOf(user))
  if (!check.ok) throw createError({ statusCode: check.statusCode, message: check.message, data: { state: check.state } })
  return row
}

async function audited(trx: Knex.Transaction, user: Member, planId: number, action: string, from: BlendPlanRow['state'] | null, to: BlendPlanRow['state'], version: number, detail?: Record<string, unknown>) {
  await insertPlanEvent(trx, { planId, action, fromState: from, toState: to, version, byUserId: user.id, detail })
  await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: `blend-plan.${action}`, objectType: 'blend_plan', objectId: planId, detail })
}

// ----- Reads -----

export async function listPlans(user: Member, query: BlendPlanListQuery): Promise<BlendPlanList> {
  const { rows, total } = await listPlanRows(useDb(), user.orgId, query)
  return { items: rows.map(summaryOf), total }
}

export async function getPlan(user: Member, id: number): Promise<BlendPlan> {
  const db = useDb()
  const row = await findPlanRow(db, user.orgId, id)
  if (!row) notFound('That plan')
  const [lots, pressing, history] = await Promise.all([planLots(db, id), pressingOfPlan(db, user.orgId, id), listPlanEvents(db, id)])
  return {
    ...summaryOf(row), request: row.request, result: row.result, notes: row.notes, lots, pressing, history,
    moves: blendPlanMovesFrom(row.state, actorOf(user)).map(m => m.action),
  }
}

// ----- Drafts -----

export async function createPlan(user: Member, input: BlendPlanCreateInput): Promise<number> {
  const result = await solveBlendFor(user.orgId, input.request)
  return transactionRetried(async (trx) => {
    const id = await insertPlan(trx, {
      orgId: user.orgId, name: input.name, state: 'draft', request: JSON.stringify(input.request), result: JSON.stringify(result),
      notes: input.notes, createdByUserId: user.id, updatedByUserId: user.id,
    })
    await audited(trx, user, id, 'saved', null, 'draft', 1, { name: input.name, status: result.status })
    return id
  })
}

export async function updatePlan(user: Member, id: number, input: BlendPlanPatchInput): Promise<void> {
  const result = input.request ? await solveBlendFor(user.orgId, input.request) : undefined
  await transactionRetried(async (trx) => {
    const row = checked(user, await lockPlan(trx, user.orgId, id), 'edit')
    const changes: Record<string, unknown> = { version: row.version + 1, updatedByUserId: user.id }
    if (input.name !== undefined) changes.name = input.name
    if (input.notes !== undefined) changes.notes = input.notes
    if (input.request && result) Object.assign(changes, { request: JSON.stringify(input.request), result: JSON.stringify(result) })
    await updatePlanRow(trx, user.orgId, id, changes)
    await audited(trx, user, id, 'edited', 'draft', 'draft', row.version + 1, { fields: Object.keys(input).filter(k => input[k as keyof BlendPlanPatchInput] !== undefined) })
  })
}

export async function deletePlan(user: Member, id: number): Promise<void> {
  await transactionRetried(async (trx) => {
    const row = checked(user, await lockPlan(trx, user.orgId, id), 'delete')
    await deletePlanRow(trx, user.orgId, id)
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'blend-plan.deleted', objectType: 'blend_plan', objectId: id, detail: { name: row.name } })
  })
}

// ----- Commit and release -----

/** The lots to name when a plan no longer fits: those with less free than the plan counted on, else those it used up. */
function shortLots(before: BlendSolveResponse, now: BlendSolveResponse): { lotId: number, code: string, freeKg: number }[] {
  const freeNow = new Map<number, { code: string, freeKg: number, kg: number }>()
  for (const line of now.lines) if ('lotId' in line) freeNow.set(line.lotId, { code: line.code, freeKg: line.freeKg, kg: line.kg })
  for (const r of now.rejected) if (!freeNow.has(r.lotId)) freeNow.set(r.lotId, { code: r.code, freeKg: 0, kg: 0 })
  const planned = before.lines.flatMap(l => ('lotId' in l && l.kg > 0.05 ? [l] : []))
  const short = planned.filter(l => (freeNow.get(l.lotId)?.freeKg ?? 0) < l.kg - 0.05)
    .map(l => ({ lotId: l.lotId, code: l.code, freeKg: kg1(freeNow.get(l.lotId)?.freeKg ?? 0) }))
  if (short.length) return short
  return [...freeNow.entries()].filter(([, l]) => l.kg >= l.freeKg - 0.05).map(([lotId, l]) => ({ lotId, code: l.code, freeKg: kg1(l.freeKg) }))
}

function realLotIds(request: BlendSolveInput): number[] {
  return request.lots.flatMap(l => ('lotId' in l ? [l.lotId] : []))
}

export async function commitPlan(user: Member, id: number): Promise<void> {
  await lockedWork(async (trx) => {
    const row = checked(user, await lockPlan(trx, user.orgId, id), 'commit')
    const request = validate(blendSolveSchema, row.request)
    const whatIf = request.lots.find(l => !('lotId' in l))
    if (whatIf && 'code' in whatIf) {
      throw createError({ statusCode: 409, message: `The what-if lot ${whatIf.code} is not fruit anyone holds; take it out of the plan before committing it.`, data: { state: row.state } })
    }
    await lockLots(trx, realLotIds(request))
    const result = await solveBlendFor(user.orgId, request, trx)
    if (result.status !== 'optimal') {
      const lots = shortLots(row.result, result)
      const [first] = lots
      const message = first
        ? `Lot ${first.code} has only ${kgText(first.freeKg)} free now, so this plan no longer fits; solve it again on what is free.`
        : 'This plan no longer fits what is free now; solve it again on what is free.'
      throw createError({ statusCode: 409, message, data: { state: row.state, lots, misses: result.misses } })
    }
    const reserved = result.lines.flatMap(l => ('lotId' in l && l.kg >= 0.05 ? [{ lotId: l.lotId, kg: Math.min(kg1(l.kg), l.freeKg), litres: kg1(l.litres) }] : []))
    // Read again under the locks: no plan may hold more of a lot than is free of it.
    const free = new Map((await blendLotRowsByIds(trx, user.orgId, reserved.map(r => r.lotId))).map(r => [r.lotId, r]))
    const over = reserved.find(r => r.kg > (free.get(r.lotId)?.freeKg ?? 0) + 1e-6)
    if (over) {
      const lot = free.get(over.lotId)
      throw createError({ statusCode: 409, message: `Lot ${lot?.code ?? over.lotId} has only ${kgText(lot?.freeKg ?? 0)} free now.`, data: { state: row.state, lots: [{ lotId: over.lotId, code: lot?.code ?? '', freeKg: kg1(lot?.freeKg ?? 0) }] } })
    }
    await insertReservations(trx, id, reserved)
    await updatePlanRow(trx, user.orgId, id, { state: 'committed', result: JSON.stringify(result), version: row.version + 1, committedAt: trx.fn.now(3), updatedByUserId: user.id })
    await audited(trx, user, id, 'committed', 'draft', 'committed', row.version + 1, { lots: reserved })
  })
}

export async function releasePlan(user: Member, id: number): Promise<void> {
  await transactionRetried(async (trx) => {
    const row = checked(user, await lockPlan(trx, user.orgId, id), 'release')
    await updatePlanRow(trx, user.orgId, id, { state: 'released', version: row.version + 1, releasedAt: trx.fn.now(3), updatedByUserId: user.id })
    await audited(trx, user, id, 'released', 'committed', 'released', row.version + 1)
  })
}

// ----- Pressing -----

export async function pressPlan(user: Member, id: number, input: PressingInput): Promise<number> {
  return lockedWork(async (trx) => {
    const row = checked(user, await lockPlan(trx, user.orgId, id), 'press')
    // Any lot the plan was solved over may be pressed, whatever the commit held of it.
    const held = new Map((await planLots(trx, id)).map(l => [l.lotId, l.kg]))
    const inPlan = new Set([...realLotIds(row.request as BlendSolveInput), ...held.keys()])
    const notInPlan = input.lots.map((l, i) => ({ l, i })).filter(({ l }) => !inPlan.has(l.lotId))
    if (notInPlan.length) throw fieldError(notInPlan.map(({ i }) => ({ path: `lots.${i}.lotId`, message: 'This lot is not in the plan' })))
    const lotIds = input.lots.map(l => l.lotId)
    const locked = new Map((await lockLots(trx, lotIds)).map(l => [l.id, l]))
    // A lot of the plan's request the grower has since deleted is named, not met with a 500.
    const gone = input.lots.map((l, i) => ({ l, i })).filter(({ l }) => !locked.has(l.lotId))
    if (gone.length) throw fieldError(gone.map(({ i }) => ({ path: `lots.${i}.lotId`, message: 'This lot no longer exists' })))
    const weighed = await pressableKg(trx, user.orgId, lotIds)
    const atGrower = input.lots.find(l => weighed.get(l.lotId)!.weighedKg <= 0)
    if (atGrower) {
      const code = locked.get(atGrower.lotId)!.code
      throw createError({ statusCode: 409, message: `Lot ${code} is still at the grower's: record its delivery at your press before pressing it.`, data: { state: row.state, lotId: atGrower.lotId, code } })
    }
    const free = new Map((await blendLotRowsByIds(trx, user.orgId, lotIds)).map(r => [r.lotId, r.freeKg]))
    const issues = input.lots.flatMap((l, i) => {
      const w = weighed.get(l.lotId)!
      const code = locked.get(l.lotId)!.code
      const inHand = w.weighedKg - w.pressedKg
      // What other committed plans hold is theirs: this plan may take its own and what is free.
      const mayTake = Math.min(inHand, (free.get(l.lotId) ?? 0) + (held.get(l.lotId) ?? 0))
      return l.kg > mayTake + 1e-6 ? [{ path: `lots.${i}.kg`, message: `Only ${kgText(Math.max(0, mayTake))} of ${code} is weighed in and yours to press` }] : []
    })
    if (issues.length) throw fieldError(issues)
    const pressingId = await insertPressing(trx, {
      orgId: user.orgId, planId: id, pressedOn: input.pressedOn, litresPressed: input.litresPressed, vessel: input.vessel, notes: input.notes, recordedByUserId: user.id,
    }, input.lots)
    // A lot wholly delivered and now wholly pressed has nothing left: it is pressed.
    const done = input.lots.filter((l) => {
      const w = weighed.get(l.lotId)!
      return locked.get(l.lotId)!.state === 'delivered' && w.pressedKg + l.kg >= w.deliveredKg - 0.05
    }).map(l => l.lotId)
    await setLotsPressed(trx, done)
    await updatePlanRow(trx, user.orgId, id, { state: 'pressed', version: row.version + 1, pressedAt: trx.fn.now(3), updatedByUserId: user.id })
    await audited(trx, user, id, 'pressed', 'committed', 'pressed', row.version + 1, { pressingId, litresPressed: input.litresPressed, lots: input.lots })
    return pressingId
  })
}

// ----- Pressings and the trace -----

export async function getPressing(user: Member, id: number): Promise<Pressing> {
  const pressing = await findPressing(useDb(), user.orgId, id)
  if (!pressing) notFound('That pressing')
  return pressing
}

export async function tracePressing(user: Member, id: number): Promise<PressingTrace> {
  const pressing = await getPressing(user, id)
  return { pressing, lots: await pressingSources(useDb(), user.orgId, pressing) }
}

export async function traceLot(user: Member, lotId: number): Promise<LotTrace> {
  const db = useDb()
  const [visible] = await lotIdsVisibleTo(db, user.orgId, [lotId])
  if (!visible) notFound('That lot')
  const lot = (await lotOwner(db, lotId))!
  if (lot.orgId === user.orgId) return { lotId, code: lot.code, view: 'grower', plans: [], pressings: await lotTraceForGrower(db, lotId) }
  return { lotId, code: lot.code, view: 'maker', ...await lotTraceForMaker(db, user.orgId, lotId) }
}
