import type { MakerSupplyReport, NeedRow, NeedsTable, TreeContractWithoutCurve } from '#shared/types/coverage'
import { makerSupply, type SupplyTreeContract } from '#shared/utils/coverage'
import { FORECAST_CLASSES } from '#shared/utils/forecast'
import { buyerTreeContracts, fruitContractsWithSchedule, organisationHemisphere, type SupplyTreeContractRow } from '../repositories/coverage'
import { lockNeeds, needRows, replaceNeedRows } from '../repositories/needs'
import { recordAudit } from '../utils/audit'
import { bearingCurveOf } from '../utils/bearingCurve'
import { useDb } from '../utils/db'
import { coverageContracts, type YearSpan } from './coverage'

// A maker's needs: how much fruit of each class it plans to press in each harvest year, kept as
// one table that a save replaces whole, and set against the supply it has contracted: fruit under
// accepted fruit contracts, and the crop still to come from trees it has bought under tree contracts.

function byClassThenYear(rows: NeedRow[]): NeedRow[] {
  const order = (r: NeedRow) => FORECAST_CLASSES.indexOf(r.juiceClass)
  return [...rows].sort((a, b) => order(a) - order(b) || a.year - b.year)
}

const table = (rows: NeedRow[]): NeedsTable => ({ items: byClassThenYear(rows), total: rows.length })

export async function getNeeds(orgId: number): Promise<NeedsTable> {
  return table(await needRows(useDb(), orgId))
}

/** Replaces the whole table in one transaction, the organisation's needs locked; answers the new table. */
export function replaceNeeds(orgId: number, actorId: number, items: NeedRow[]): Promise<NeedsTable> {
  return useDb().transaction(async (trx) => {
    const before = await lockNeeds(trx, orgId)
    await replaceNeedRows(trx, orgId, items)
    const sum = (rows: NeedRow[]) => rows.reduce((kg, r) => kg + r.kg, 0)
    await recordAudit(trx, {
      orgId, actorUserId: actorId, action: 'needs.replaced', objectType: 'maker_needs', objectId: orgId,
      detail: { rowsBefore: before.length, rows: items.length, kgBefore: sum(before), kg: sum(items) },
    })
    return table(await needRows(trx, orgId))
  })
}

/**
 * A tree contract's trees as supply counts them: the ordered count until delivered, then the
 * count delivered, on the rootstock's bearing curve at the middle of its published range (as a
 * block is forecast unless its grower says otherwise). The contract's survival rate is the
 * nursery's (budded trees that reach sale) and is already inside the ordered count, so it is not
 * applied again.
 */
function supplyTrees(rows: SupplyTreeContractRow[]): { trees: SupplyTreeContract[], withoutCurve: TreeContractWithoutCurve[] } {
  const trees: SupplyTreeContract[] = []
  const withoutCurve: TreeContractWithoutCurve[] = []
  for (const row of rows) {
    const { curve, note } = bearingCurveOf({ ...row, designation: row.rootstockDesignation })
    if (!curve) {
      withoutCurve.push({ id: row.id, rootstockDesignation: row.rootstockDesignation, note })
      continue
    }
    trees.push({
      state: row.state,
      trees: row.state === 'delivered' ? (row.deliveredCount ?? row.treeCount) : row.treeCount,
      variety: { species: row.species, juiceClass: row.juiceClass },
      curve,
      deliveryYear: row.deliveryYear,
      deliverySeason: row.deliverySeason,
    })
  }
  return { trees, withoutCurve }
}

/** The maker's need per class and year over `span` against its accepted fruit contracts and its trees to come. */
export async function makerSupplyReport(orgId: number, span: YearSpan): Promise<MakerSupplyReport> {
  const db = useDb()
  const [needs, { contracts, schedule }, treeRows, hemisphere] = await Promise.all([
    needRows(db, orgId),
    fruitContractsWithSchedule(db, 'maker', orgId, ['accepted']),
    buyerTreeContracts(db, orgId),
    organisationHemisphere(db, orgId),
  ])
  const { trees, withoutCurve } = supplyTrees(treeRows)
  const rows = makerSupply(needs, coverageContracts(contracts, schedule, span), trees, { ...span, hemisphere })
  return { startYear: span.startYear, years: Array.from({ length: span.years }, (_, i) => span.startYear + i), rows, treeContractsWithoutCurve: withoutCurve }
}
