import { expiredUntold, type ContractParties } from '../repositories/contracts'
import { useDb } from '../utils/db'
import { systemEvent, today, type ContractKindService, type ContractRowBase } from './contracts'
import { FRUIT_CONTRACTS, fulfilClosedContracts } from './fruitContracts'
import { TREE_CONTRACTS } from './treeContracts'

// The moves nobody makes by hand, made by every app instance on a timer: an offer whose last day
// has passed is recorded as expired and both sides are told (once per version); a fruit contract
// whose last delivery window has closed is fulfilled. Each is one transaction with the row locked,
// so two instances never record one twice.

const KINDS = [TREE_CONTRACTS, FRUIT_CONTRACTS] as unknown as ContractKindService<ContractRowBase, string>[]

async function recordExpiries(service: ContractKindService<ContractRowBase, string>, limit: number): Promise<number> {
  const db = useDb()
  const { table } = service.parties as ContractParties
  let done = 0
  for (const { id } of await expiredUntold(db, table, today(), limit)) {
    await db.transaction(async (trx) => {
      const row = await trx(table).where({ id }).whereIn('state', ['offered', 'countered']).forUpdate().first() as (ContractRowBase & Record<string, unknown>) | undefined
      if (!row || row.expiryNoticedVersion === row.version) return
      await trx(table).where({ id }).update({ expiryNoticedVersion: row.version })
      const what = await service.describe(trx, row)
      await systemEvent(trx, service, row, 'expired', {
        subject: `Offer expired: ${service.noun} for ${what}`,
        body: `The offer (version ${row.version}) of the ${service.noun} for ${what} could be accepted until ${String(row.expiresOn).slice(0, 10)} and has expired. It can still be countered or declined; to agree, one side makes a new offer.`,
      })
      done++
    })
  }
  return done
}

export async function runContractClock(limit = 50): Promise<{ expired: number, fulfilled: number }> {
  let expired = 0
  for (const kind of KINDS) expired += await recordExpiries(kind, limit)
  const fulfilled = await fulfilClosedContracts(limit)
  return { expired, fulfilled }
}
