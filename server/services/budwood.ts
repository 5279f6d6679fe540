import type { BudwoodClearInput, BudwoodCreateInput, BudwoodSuspectInput } from '#shared/schemas/nursery'
import type { BudwoodLot, ExposureItem, ExposureReport } from '#shared/types/nursery'
import { budwoodFieldIssues } from '#shared/utils/budwoodRules'
import { exposedRuns, type Exposure } from '#shared/utils/exposure'
import { runCounts } from '#shared/utils/runCounts'
import {
  clearBudwoodSuspect, contractBuyers, findOwnBlock, findBudwood, insertBudwood, lockBudwood, markBudwoodSuspect, suspectLots, workingEventsOnDaysOf,
} from '../repositories/budwood'
import { findCatalogueRow } from '../repositories/catalogue'
import { eventsOfRuns, findRunRowsByIds } from '../repositories/nurseryRuns'
import { VARIETIES } from '../repositories/varieties'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type Db, type DbRefusals } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'
import { tellParty, type Member } from './contracts'
import { queueNoticeToOwners } from './notices'

// Budwood lots: where each bud came from. A lot cut from the nursery's own block must be from one
// of its own blocks, of the variety that block grows; one from a single tree says which tree;
// bought-in wood names its supplier and certificate (shared/utils/budwoodRules).

function refusals(label: string): DbRefusals {
  return {
    duplicate: { field: 'label', issue: 'Another lot already has this label', message: `A budwood lot labelled "${label}" is already recorded. Choose another label.` },
    missingReference: { field: 'varietyId', message: 'The variety or block is no longer there' },
  }
}

export async function getBudwood(orgId: number, id: number): Promise<BudwoodLot> {
  const lot = await findBudwood(useDb(), orgId, id)
  if (!lot) notFound('That budwood lot')
  return lot
}

export async function createBudwood(orgId: number, actorId: number, input: BudwoodCreateInput): Promise<BudwoodLot> {
  const id = await withDbRefusals(refusals(input.label), () => useDb().transaction(async (trx) => {
    const issues = budwoodFieldIssues(input.sourceKind, input)
    if (issues.length) throw fieldError(issues)
    const variety = await findCatalogueRow<{ name: string }>(trx, VARIETIES, input.varietyId)
    if (!variety) throw fieldError([{ path: 'varietyId', message: 'No variety with that id is in the catalogue' }])
    if (input.blockId !== null) {
      // Another organisation's block is answered as no block at all.
      const block = await findOwnBlock(trx, orgId, input.blockId)
      if (!block) throw fieldError([{ path: 'blockId', message: 'Choose one of your own orchard blocks' }])
      if (block.varietyId !== input.varietyId) {
        throw fieldError([{ path: 'varietyId', message: `${block.name} grows ${block.varietyName}, not ${variety.name}: choose the variety the block grows, or the block it was cut from` }])
      }
    }
    const id = await insertBudwood(trx, orgId, input)
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'budwood_lot.created', objectType: 'budwood_lot', objectId: id, detail: { label: input.label, varietyId: input.varietyId, sourceKind: input.sourceKind } })
    return id
  }))
  return getBudwood(orgId, id)
}

// ----- Suspect lots and their exposure -----
// Fire blight travels on budwood that looks healthy and on the knife to the rootstocks budded after
// it (shared/utils/exposure). A lot marked suspect lists every run it may have reached, and the
// buyers of the trees on that list are told in the same transaction as the marking.

const number = (n: number) => n.toLocaleString('en-GB')

/** The runs exposed to the lot, in map order, with their counts, the events that expose them and their contract. */
async function exposureItems(db: Db, orgId: number, lotId: number): Promise<(ExposureItem & { contractId: number | null })[]> {
  const events = await workingEventsOnDaysOf(db, orgId, [lotId])
  const exposures = new Map(exposedRuns(lotId, events).map(e => [e.runId, e]))
  if (!exposures.size) return []
  const byId = new Map(events.map(e => [e.id, e]))
  const rows = await findRunRowsByIds(db, orgId, [...exposures.keys()])
  const runEvents = await eventsOfRuns(db, orgId, rows.map(r => r.id))
  return rows.map((row) => {
    const exposure = exposures.get(row.id)!
    const counts = runCounts(row.linedOutCount, runEvents.filter(e => e.runId === row.id))
    return {
      run: {
        id: row.id, rowName: row.rowName, fieldName: row.fieldName, fromPosition: row.fromPosition, toPosition: row.toPosition,
        varietyName: row.varietyName, rootstockDesignation: row.rootstockDesignation,
        counts: { standing: counts.standing, worked: counts.worked, dug: counts.dug },
      },
      reason: exposure.reason,
      events: exposure.eventIds.map((id) => {
        const { id: eventId, kind, happenedOn, byName, dayOrder, count, budwoodLotId, budwoodLabel } = byId.get(id)!
        return { id: eventId, kind, happenedOn, byName, dayOrder, count, budwoodLotId, budwoodLabel }
      }),
      contract: row.contractId === null ? null : { id: row.contractId, buyerOrgName: row.contractBuyerOrgName! },
      contractId: row.contractId,
    }
  })
}

function report(lot: BudwoodLot, items: (ExposureItem & { contractId: number | null })[]): ExposureReport {
  const contracts = new Set(items.flatMap(i => (i.contractId === null ? [] : [i.contractId])))
  return {
    lot,
    items: items.map(({ contractId: _c, ...item }) => item),
    totals: { runs: items.length, standing: items.reduce((sum, i) => sum + i.run.counts.standing, 0), contracts: contracts.size },
  }
}

/** Any lot of the nursery's, suspect or not: what it would reach, so a nursery can look before it decides. */
export async function budwoodExposure(orgId: number, id: number): Promise<ExposureReport> {
  const db = useDb()
  const lot = await findBudwood(db, orgId, id)
  if (!lot) notFound('That budwood lot')
  return report(lot, await exposureItems(db, orgId, id))
}

const REASON_WORDS: Record<Exposure['reason'], string> = {
  'budded-with-lot': 'worked with the lot',
  'budded-after-lot': 'worked after it the same day with the same hands',
}

function runLine(item: ExposureItem): string {
  const { run } = item
  const positions = run.fromPosition === run.toPosition ? `position ${run.fromPosition}` : `positions ${run.fromPosition}–${run.toPosition}`
  return `${number(run.counts.standing)} ${run.varietyName} on ${run.rootstockDesignation} standing in row ${run.rowName}, ${positions} (${REASON_WORDS[item.reason]})`
}

/** Marks the lot suspect and tells each buyer with trees on its exposure list, once per buyer, and the nursery's owners. */
export async function markBudwoodSuspectFor(user: Member, id: number, input: BudwoodSuspectInput): Promise<BudwoodLot> {
  await useDb().transaction(async (trx) => {
    const locked = await lockBudwood(trx, user.orgId, id)
    if (!locked) notFound('That budwood lot')
    if (locked.suspectOn !== null && locked.suspectClearedAt === null) {
      const lot = (await findBudwood(trx, user.orgId, id))!
      throw createError({ statusCode: 409, message: `Budwood lot ${locked.label} has been suspect since ${lot.suspect!.on}: clear it before marking it again.`, data: { state: 'suspect', suspect: lot.suspect } })
    }
    await markBudwoodSuspect(trx, user.orgId, id, input, user.id)
    const lot = (await findBudwood(trx, user.orgId, id))!
    const items = await exposureItems(trx, user.orgId, id)
    const nursery = await trx('organisations').where({ id: user.orgId }).first('name') as { name: string }
    const buyers = new Map<number, { name: string, contracts: Map<number, ExposureItem[]> }>()
    for (const buyer of await contractBuyers(trx, user.orgId, [...new Set(items.flatMap(i => (i.contractId === null ? [] : [i.contractId])))])) {
      const entry = buyers.get(buyer.buyerOrgId) ?? { name: buyer.buyerOrgName, contracts: new Map() }
      entry.contracts.set(buyer.id, items.filter(i => i.contractId === buyer.id))
      buyers.set(buyer.buyerOrgId, entry)
    }
    const what = `Budwood lot ${lot.label} (${lot.varietyName})`
    for (const [buyerOrgId, { contracts }] of buyers) {
      const lines = [...contracts].map(([contractId, list]) => `Tree contract ${contractId}: ${list.map(runLine).join('; ')}.`)
      const trees = [...contracts.values()].flat().reduce((sum, i) => sum + i.run.counts.standing, 0)
      await tellParty(trx, buyerOrgId, null, {
        subject: `${nursery.name}: budwood used on your trees is suspected of disease`,
        body: `${nursery.name} marked ${what} suspect of disease from ${input.suspectOn}: ${input.reason}\n\n`
          + `${number(trees)} of the trees it grows for you are on the lot's exposure list:\n${lines.join('\n')}\n\n`
          + `${nursery.name} will advise you what this means for your trees and their delivery.`,
        link: `/contracts/tree/${[...contracts.keys()][0]}`,
        kind: 'budwood.suspect',
      })
    }
    const totals = report(lot, items).totals
    await queueNoticeToOwners(trx, user.orgId, {
      subject: `${what} marked suspect of disease`,
      body: `${user.name} marked ${what} suspect from ${input.suspectOn}: ${input.reason}\n\n`
        + `${totals.runs} run${totals.runs === 1 ? '' : 's'} with ${number(totals.standing)} trees standing are on its exposure list; `
        + `${buyers.size} buyer${buyers.size === 1 ? ' was' : 's were'} told.`,
      link: `/nursery/budwood/${id}`,
      kind: 'budwood.suspect',
    }, user.id)
    await recordAudit(trx, {
      orgId: user.orgId, actorUserId: user.id, action: 'budwood_lot.suspect_marked', objectType: 'budwood_lot', objectId: id,
      detail: { suspectOn: input.suspectOn, reason: input.reason, exposedRunIds: items.map(i => i.run.id), buyersTold: [...buyers.keys()] },
    })
  })
  return getBudwood(user.orgId, id)
}

/** Clears a suspect lot; the suspicion stays on the lot with the day it was cleared and why. */
export async function clearBudwoodSuspectFor(user: Member, id: number, input: BudwoodClearInput): Promise<BudwoodLot> {
  await useDb().transaction(async (trx) => {
    const locked = await lockBudwood(trx, user.orgId, id)
    if (!locked) notFound('That budwood lot')
    if (locked.suspectOn === null || locked.suspectClearedAt !== null) {
      const state = locked.suspectOn === null ? 'not-suspect' : 'cleared'
      throw createError({ statusCode: 409, message: `Budwood lot ${locked.label} is not suspect: there is nothing to clear.`, data: { state } })
    }
    await clearBudwoodSuspect(trx, user.orgId, id, input.reason)
    await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'budwood_lot.suspect_cleared', objectType: 'budwood_lot', objectId: id, detail: { reason: input.reason } })
  })
  return getBudwood(user.orgId, id)
}

/** A lot suspect now whose exposure list holds a run: its label, since when, why the run is on it, and the day. */
export interface SuspectMark { label: string, suspectOn: string, reason: Exposure['reason'], on: string }

/** For each run on the exposure list of a lot suspect now, which lots and why: what the run's warnings say. */
export async function suspectExposures(db: Db, orgId: number): Promise<Map<number, SuspectMark[]>> {
  const found = new Map<number, SuspectMark[]>()
  const lots = await suspectLots(db, orgId)
  if (!lots.length) return found
  const events = await workingEventsOnDaysOf(db, orgId, lots.map(l => l.id))
  const dayOf = new Map(events.map(e => [e.id, e.happenedOn]))
  for (const lot of lots) {
    for (const exposure of exposedRuns(lot.id, events)) {
      const on = dayOf.get(exposure.eventIds[0]!)!
      found.set(exposure.runId, [...found.get(exposure.runId) ?? [], { label: lot.label, suspectOn: lot.suspectOn, reason: exposure.reason, on }])
    }
  }
  return found
}
