import type { Knex } from 'knex'
import type { CropFailureTerm } from '#shared/schemas/contract'
import type { DeliverySettlement, StatementParty } from '#shared/types/delivery'
import type { FruitSpecies, JuiceClass } from '#shared/utils/juiceClass'
import type { StatementContract, StatementDeliveryRow } from '#shared/utils/statement'
import { fromJson, type Db } from '../utils/db'

// Read-only queries for self-billing statements. A statement is the two parties' alone: every
// query goes through the fruit contract and names the calling organisation as its maker or its
// grower, so another organisation's delivery or contract is simply not there. Only a contract that
// was accepted has deliveries to state.

export interface StatementContractRow extends StatementContract {
  makerOrgId: number
  growerOrgId: number
  tolerancePct: number
  cropFailure: CropFailureTerm
}

/** Narrows a query on `fruitContracts as fc` to the accepted contracts the organisation is a party to. */
function partyTo(q: Knex.QueryBuilder, orgId: number): Knex.QueryBuilder {
  return q.whereNotNull('fc.acceptedVersion').andWhere(w => w.where('fc.makerOrgId', orgId).orWhere('fc.growerOrgId', orgId))
}

const CONTRACT_COLUMNS = [
  'fc.id', 'fc.makerOrgId', 'fc.growerOrgId', 'v.name as varietyName', 'fc.species', 'fc.juiceClass', 'fc.currency',
  'fc.basePricePerTonneMinor', 'fc.baselineBrix', 'fc.bonusPerBrixPerTonneMinor', 'fc.deductionPerBrixPerTonneMinor',
  'fc.rejectFloorBrix', 'fc.tolerancePct', 'fc.cropFailure', 'v.species as varietySpecies', 'v.juiceClass as varietyJuiceClass',
]

type ContractSelect = Omit<StatementContractRow, 'years'> & { varietySpecies: FruitSpecies | null, varietyJuiceClass: JuiceClass | null }

async function withYears(db: Db, rows: ContractSelect[]): Promise<StatementContractRow[]> {
  if (!rows.length) return []
  const years = await db('fruitContractYears').whereIn('contractId', rows.map(r => r.id)).orderBy(['contractId', 'harvestYear'])
    .select('contractId', 'harvestYear') as { contractId: number, harvestYear: number }[]
  // A contract for one variety reads as that variety; its species and class are the catalogue's.
  return rows.map(({ varietySpecies, varietyJuiceClass, ...row }) => ({
    ...row,
    species: row.species ?? varietySpecies,
    juiceClass: row.juiceClass ?? varietyJuiceClass,
    years: years.filter(y => y.contractId === row.id).map(y => y.harvestYear),
  }))
}

export async function findStatementContract(db: Db, orgId: number, id: number): Promise<StatementContractRow | undefined> {
  const row = await partyTo(db('fruitContracts as fc').leftJoin('varieties as v', 'v.id', 'fc.varietyId'), orgId)
    .where('fc.id', id).first(CONTRACT_COLUMNS) as ContractSelect | undefined
  return row ? (await withYears(db, [row]))[0] : undefined
}

/** A party as it stands in its settings: the contact and e-mail it shows counterparties, and its tax rate. */
export async function statementParty(db: Db, orgId: number): Promise<StatementParty> {
  const row = await db('organisations').where({ id: orgId })
    .first('id as orgId', 'name', 'contactName', 'publicEmail as email', 'contactPhone as phone', 'taxRatePct') as StatementParty
  return row
}

interface DeliverySelect extends Omit<StatementDeliveryRow, 'settlement'> {
  settlement: string | DeliverySettlement
  fruitContractId: number
  harvestYear: number
  updatedAt: Date
}

export type StatementDelivery = StatementDeliveryRow & { fruitContractId: number, harvestYear: number, updatedAt: Date }

const DELIVERY_COLUMNS = [
  'd.id', 'd.fruitContractId', 'd.harvestYear', 'd.deliveredOn', 'l.code as lotCode', 'v.name as varietyName', 'd.ticketNo',
  'd.grossKg', 'd.tareKg', 'd.netKg', 'd.readingBrix', 'd.readingSampledOn', 'd.state', 'd.settlement', 'd.amountMinor',
  'd.taxMinor', 'd.totalMinor', 'd.updatedAt',
]

function deliveriesOf(db: Db, orgId: number) {
  return partyTo(db('deliveries as d')
    .join('fruitContracts as fc', 'fc.id', 'd.fruitContractId')
    .join('harvestLots as l', 'l.id', 'd.lotId')
    .join('varieties as v', 'v.id', 'l.varietyId'), orgId)
}

const toDelivery = (row: DeliverySelect): StatementDelivery => ({
  ...row,
  settlement: fromJson(row.settlement),
})

export async function findStatementDelivery(db: Db, orgId: number, id: number): Promise<StatementDelivery | undefined> {
  const row = await deliveriesOf(db, orgId).where('d.id', id).first(DELIVERY_COLUMNS) as DeliverySelect | undefined
  return row ? toDelivery(row) : undefined
}

/** Every delivery of the contract's harvest year, in the order delivered. */
export async function seasonDeliveries(db: Db, orgId: number, contractId: number, harvestYear: number): Promise<StatementDelivery[]> {
  const rows = await deliveriesOf(db, orgId).where({ 'd.fruitContractId': contractId, 'd.harvestYear': harvestYear })
    .orderBy([{ column: 'd.deliveredOn' }, { column: 'd.id' }]).select(DELIVERY_COLUMNS) as DeliverySelect[]
  return rows.map(toDelivery)
}

export interface SeasonRow {
  fruitContractId: number
  harvestYear: number
  makerName: string
  growerName: string
  deliveries: number
  totalMinor: number
  contract: StatementContractRow
}

/** The seasons with deliveries on the organisation's contracts, newest first. */
export async function listSeasonRows(db: Db, orgId: number, page: { limit: number, offset: number, season?: number }): Promise<{ rows: SeasonRow[], total: number }> {
  const grouped = () => {
    const q = partyTo(db('deliveries as d').join('fruitContracts as fc', 'fc.id', 'd.fruitContractId'), orgId)
    if (page.season !== undefined) q.andWhere('d.harvestYear', page.season)
    return q.groupBy('d.fruitContractId', 'd.harvestYear')
  }
  const rows = await grouped()
    .select('d.fruitContractId', 'd.harvestYear', db.raw('COUNT(*) AS deliveries'),
      db.raw('SUM(CASE WHEN d.state = \'disputed\' THEN 0 ELSE d.total_minor END) AS total_minor'), db.raw('COUNT(*) OVER () AS list_total'))
    .orderBy([{ column: 'd.harvestYear', order: 'desc' }, { column: 'd.fruitContractId', order: 'desc' }])
    .limit(page.limit).offset(page.offset) as { fruitContractId: number, harvestYear: number, deliveries: number, totalMinor: number, listTotal: number }[]
  const total = rows.length
    ? Number(rows[0]!.listTotal)
    : Number(((await db.from(grouped().select('d.fruitContractId').as('s')).count({ n: '*' })) as { n: number }[])[0]!.n)
  if (!rows.length) return { rows: [], total }
  const ids = [...new Set(rows.map(r => r.fruitContractId))]
  const contracts = await withYears(db, await partyTo(db('fruitContracts as fc').leftJoin('varieties as v', 'v.id', 'fc.varietyId'), orgId)
    .whereIn('fc.id', ids).select(CONTRACT_COLUMNS) as ContractSelect[])
  const names = new Map((await db('organisations').whereIn('id', contracts.flatMap(c => [c.makerOrgId, c.growerOrgId])).select('id', 'name') as { id: number, name: string }[])
    .map(o => [o.id, o.name]))
  const byId = new Map(contracts.map(c => [c.id, c]))
  return {
    total,
    rows: rows.map((r) => {
      const contract = byId.get(r.fruitContractId)!
      return {
        fruitContractId: r.fruitContractId, harvestYear: r.harvestYear, deliveries: Number(r.deliveries), totalMinor: Number(r.totalMinor),
        makerName: names.get(contract.makerOrgId)!, growerName: names.get(contract.growerOrgId)!, contract,
      }
    }),
  }
}
