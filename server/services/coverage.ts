import type { GrowerCoverageReport } from '#shared/types/coverage'
import type { FruitContractState } from '#shared/utils/contractStatus'
import { contractClassOf, growerCoverage, type ContractFruit, type CoverageContract, type OverCommitment } from '#shared/utils/coverage'
import type { ForecastClass } from '#shared/utils/forecast'
import type { JuiceClass } from '#shared/utils/juiceClass'
import { fruitContractsWithSchedule, type CoverageFruitContractRow, type CoverageScheduleRow } from '../repositories/coverage'
import { useDb } from '../utils/db'
import { organisationForecast } from './blocks'

// Coverage: will the fruit a grower has promised grow? Its forecast per juice class and year (the
// block service's) against the tonnes of its fruit contracts, the accepted ones and the open offers.
// Drafts, declined, cancelled and fulfilled contracts do not count, so a maker's draft, which the
// grower has not been shown, never moves the grower's figures.

/** The states growerCoverage reads: what the grower has promised, and what it is being asked. */
const COUNTED_STATES: readonly FruitContractState[] = ['accepted', 'offered', 'countered']

export interface YearSpan { startYear: number, years: number }

/** What a contract is for, as coverage reads it: its variety's class, or its own species and class. */
function fruitOfRow(row: CoverageFruitContractRow): ContractFruit {
  if (row.varietySpecies && row.varietyJuiceClass) return { variety: { species: row.varietySpecies, juiceClass: row.varietyJuiceClass } }
  return { species: row.species ?? 'apple', juiceClass: row.juiceClass! }
}

/** A class as coverage sums it (`perry …` for pears) back to the species and class of a contract. */
function fruitOfClass(fruitClass: ForecastClass): ContractFruit {
  return fruitClass.startsWith('perry ')
    ? { species: 'pear', juiceClass: fruitClass.slice('perry '.length) as JuiceClass }
    : { species: 'apple', juiceClass: fruitClass as JuiceClass }
}

const inSpan = (span: YearSpan) => (line: { year: number }) => line.year >= span.startYear && line.year < span.startYear + span.years

/** Contract rows as the coverage arithmetic reads them, each schedule cut to the years of `span`. */
export function coverageContracts(contracts: CoverageFruitContractRow[], schedule: CoverageScheduleRow[], span: YearSpan): CoverageContract[] {
  return contracts.map(c => ({
    state: c.state,
    fruit: fruitOfRow(c),
    tolerancePct: c.tolerancePct,
    schedule: schedule.filter(y => y.contractId === c.id).filter(inSpan(span)),
  }))
}

/** The grower's coverage over `span`: per class and year, with the over-commitment warnings and the contracts counted. */
export async function growerCoverageReport(orgId: number, span: YearSpan): Promise<GrowerCoverageReport> {
  const [forecast, { contracts, schedule }] = await Promise.all([
    organisationForecast(orgId, span),
    fruitContractsWithSchedule(useDb(), 'grower', orgId, COUNTED_STATES),
  ])
  const { rows, overCommitted } = growerCoverage(forecast.byClass, coverageContracts(contracts, schedule, span))
  return {
    startYear: span.startYear,
    years: forecast.years,
    rows,
    overCommitted,
    contracts: contracts.map(c => ({ id: c.id, makerOrgName: c.counterpartyName, state: c.state, fruitClass: contractClassOf(fruitOfRow(c)) })),
    blocksWithoutCurve: forecast.blocksWithoutCurve,
  }
}

/**
 * The over-commitments in the offer's class that would hold were this offer accepted, over the
 * years from its first harvest year to its last: the grower's accepted contracts (less the offer
 * itself, when it is one of them by `id`) and the offer. An entry with `ifAccepted` is one that
 * accepting the offer would cause; one without is short already, and the offer adds to it.
 */
export async function offerCoverageWarning(
  growerOrgId: number,
  offer: { fruitClass: ForecastClass, schedule: { year: number, tonnes: number }[], tolerancePct: number, id?: number },
): Promise<OverCommitment[]> {
  if (offer.schedule.length === 0) return []
  const offerYears = offer.schedule.map(y => y.year)
  const startYear = Math.min(...offerYears)
  const span = { startYear, years: Math.max(...offerYears) - startYear + 1 }
  const [forecast, { contracts, schedule }] = await Promise.all([
    organisationForecast(growerOrgId, span),
    fruitContractsWithSchedule(useDb(), 'grower', growerOrgId, ['accepted'], offer.id),
  ])
  const asOffered: CoverageContract = {
    state: 'offered',
    fruit: fruitOfClass(offer.fruitClass),
    schedule: offer.schedule.map(({ year, tonnes }) => ({ year, tonnes })),
    tolerancePct: offer.tolerancePct,
  }
  const { overCommitted } = growerCoverage(forecast.byClass, [...coverageContracts(contracts, schedule, span), asOffered])
  return overCommitted.filter(w => w.juiceClass === offer.fruitClass)
}
