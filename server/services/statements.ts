import Papa from 'papaparse'
import type { StatementQuery } from '#shared/schemas/statement'
import type { Statement } from '#shared/types/delivery'
import { contractYearSummary } from '#shared/utils/deliveryYear'
import {
  buildStatement, CSV_FORMULA_START, statementContractDescription, statementCsvRows, statementFileName,
  type StatementSeasonList,
} from '#shared/utils/statement'
import { contractYear } from '../repositories/deliveries'
import {
  findStatementContract, findStatementDelivery, listSeasonRows, seasonDeliveries, statementParty,
  type StatementContractRow, type StatementDelivery,
} from '../repositories/statements'
import { useDb, type Db } from '../utils/db'
import { notFound } from '../utils/validation'

// Self-billing statements, read by both parties of a fruit contract alike: one per delivery, and
// one per contract and harvest year. Nothing here writes: a statement is made from the deliveries'
// settlements as they were worked and kept.

/** Dated by the last change to its deliveries, so the same figures read twice are the same document. */
function issuedOn(deliveries: StatementDelivery[]): string {
  const latest = deliveries.reduce<Date | null>((at, d) => (!at || new Date(d.updatedAt) > at ? new Date(d.updatedAt) : at), null)
  return (latest ?? new Date()).toISOString().slice(0, 10)
}

async function partiesOf(db: Db, contract: StatementContractRow) {
  const [buyer, seller] = await Promise.all([statementParty(db, contract.makerOrgId), statementParty(db, contract.growerOrgId)])
  return { buyer, seller }
}

export async function deliveryStatement(orgId: number, deliveryId: number): Promise<Statement> {
  const db = useDb()
  const delivery = await findStatementDelivery(db, orgId, deliveryId)
  if (!delivery) notFound('That delivery')
  const contract = (await findStatementContract(db, orgId, delivery.fruitContractId))!
  return buildStatement({
    kind: 'delivery', deliveryId, contract, ...await partiesOf(db, contract),
    harvestYear: delivery.harvestYear, rows: [delivery], year: null, issuedOn: issuedOn([delivery]),
  })
}

export async function seasonStatement(orgId: number, contractId: number, harvestYear: number): Promise<Statement> {
  const db = useDb()
  const contract = await findStatementContract(db, orgId, contractId)
  if (!contract) notFound('That fruit contract')
  const [contracted, deliveries] = await Promise.all([contractYear(db, contractId, harvestYear), seasonDeliveries(db, orgId, contractId, harvestYear)])
  if (!contracted) notFound(`A ${harvestYear} harvest of that fruit contract`)
  const year = contractYearSummary({
    fruitContractId: contractId, harvestYear, contractedTonnes: contracted.tonnes, tolerancePct: contract.tolerancePct, cropFailure: contract.cropFailure,
    deliveredKg: deliveries.reduce((kg, d) => kg + d.netKg, 0),
  })
  return buildStatement({
    kind: 'season', contract, ...await partiesOf(db, contract),
    harvestYear, rows: deliveries, year, issuedOn: issuedOn(deliveries),
  })
}

export async function listStatementSeasons(orgId: number, query: Pick<StatementQuery, 'limit' | 'offset' | 'season'>): Promise<StatementSeasonList> {
  const { rows, total } = await listSeasonRows(useDb(), orgId, query)
  return {
    total,
    items: rows.map(r => ({
      fruitContractId: r.fruitContractId,
      harvestYear: r.harvestYear,
      contractDescription: statementContractDescription(r.contract),
      buyer: r.makerName,
      seller: r.growerName,
      deliveries: r.deliveries,
      totalMinor: r.totalMinor,
      currency: r.contract.currency,
    })),
  }
}

/**
 * The statement as a CSV file to download: its body (a byte-order mark first, so spreadsheets read
 * °Brix as written) and the headers that name it.
 */
export function statementCsvFile(statement: Statement): { body: string, headers: Record<string, string> } {
  const body = Papa.unparse(statementCsvRows(statement), { newline: '\r\n', escapeFormulae: CSV_FORMULA_START })
  return {
    body: `\uFEFF${body}\r\n`,
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="${statementFileName(statement)}"`,
      'cache-control': 'no-store',
    },
  }
}
