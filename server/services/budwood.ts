import type { BudwoodCreateInput } from '#shared/schemas/nursery'
import type { BudwoodLot } from '#shared/types/nursery'
import { budwoodFieldIssues } from '#shared/utils/budwoodRules'
import { findOwnBlock, findBudwood, insertBudwood } from '../repositories/budwood'
import { findCatalogueRow } from '../repositories/catalogue'
import { VARIETIES } from '../repositories/varieties'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type DbRefusals } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'

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
