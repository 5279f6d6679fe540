import type { LinerLotCreateInput } from '#shared/schemas/nursery'
import type { LinerLot, LinerStockRow } from '#shared/types/nursery'
import { findCatalogueRow } from '../repositories/catalogue'
import { findLinerLot, insertLinerLot, listLinerLots } from '../repositories/linerLots'
import { linerStock, lockLinerStock } from '../repositories/linerStock'
import { ROOTSTOCKS } from '../repositories/rootstocks'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals } from '../utils/db'
import { fieldError } from '../utils/validation'

// Liner stock: what the nursery has to line out per rootstock and grade (lifted + bought − lined
// out, from linerStock), the lots behind it, and a lot bought in, written under the stock lock.

export interface LinerStockAnswer {
  items: LinerStockRow[]
  total: number
  lots: LinerLot[]
  lotsTotal: number
}

export async function linerStockOf(orgId: number, page: { limit: number, offset: number }): Promise<LinerStockAnswer> {
  const [items, { lots, total: lotsTotal }] = await Promise.all([linerStock(useDb(), orgId), listLinerLots(orgId, page)])
  return { items, total: items.length, lots, lotsTotal }
}

const REFUSALS = { missingReference: { field: 'rootstockId', message: 'The rootstock is no longer in the catalogue' } }

export async function buyLinerLot(orgId: number, actorId: number, input: LinerLotCreateInput): Promise<LinerLot> {
  const id = await withDbRefusals(REFUSALS, () => useDb().transaction(async (trx) => {
    await lockLinerStock(trx, orgId)
    if (!await findCatalogueRow(trx, ROOTSTOCKS, input.rootstockId)) throw fieldError([{ path: 'rootstockId', message: 'No rootstock with that id is in the catalogue' }])
    const id = await insertLinerLot(trx, orgId, { ...input, source: 'bought' })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'liner_lot.bought', objectType: 'liner_lot', objectId: id, detail: { rootstockId: input.rootstockId, grade: input.grade, count: input.count, supplier: input.supplier } })
    return id
  }))
  return (await findLinerLot(useDb(), orgId, id))!
}
