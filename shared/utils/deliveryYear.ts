import type { CropFailureTerm } from '../schemas/contract'
import type { ContractYearSummary } from '../types/delivery'

// A fruit contract's harvest year against what was delivered: the tolerance makes a band around
// the contracted tonnes (contracted × (1 ± tolerance %)); below it is a shortfall, above it an
// excess. Worked in kilograms to 0.1 kg so that sums of tickets add up exactly.

export interface ContractYearInput {
  fruitContractId: number
  harvestYear: number
  contractedTonnes: number
  tolerancePct: number
  cropFailure: CropFailureTerm
  /** Net kilograms delivered against the year so far. */
  deliveredKg: number
}

/** Kilograms to 0.1 kg, so 0.1 + 0.2 is 0.3. */
const kg = (value: number) => Math.round(value * 10) / 10
/** Tonnes to the kilogram. */
const tonnes = (kilograms: number) => Math.round(kilograms) / 1000

/** The band the tolerance allows, in kg. */
export function toleranceBandKg(contractedTonnes: number, tolerancePct: number): { lowestKg: number, highestKg: number } {
  const contractedKg = contractedTonnes * 1000
  const allowance = contractedKg * tolerancePct / 100
  return { lowestKg: kg(contractedKg - allowance), highestKg: kg(contractedKg + allowance) }
}

/** What the crop-failure term does with a shortfall of `shortfallTonnes` in `year`. */
export function shortfallMeaning(term: CropFailureTerm, shortfallTonnes: number, year: number): string | null {
  if (shortfallTonnes <= 0) return null
  const t = `${shortfallTonnes.toLocaleString('en-GB', { maximumFractionDigits: 3 })} t`
  switch (term) {
    case 'forgiven': return `If the crop failed, the shortfall of ${t} is forgiven: nothing is owed either way.`
    case 'carried': return `If the crop failed, the shortfall of ${t} is carried to the ${year + 1} harvest, on top of that year's tonnes.`
    case 'owed': return `The shortfall of ${t} is owed by the grower, crop failure or not, as the contract's terms set out.`
  }
}

export function contractYearSummary(input: ContractYearInput): ContractYearSummary {
  const { lowestKg, highestKg } = toleranceBandKg(input.contractedTonnes, input.tolerancePct)
  const deliveredKg = kg(input.deliveredKg)
  const shortfallTonnes = tonnes(Math.max(0, lowestKg - deliveredKg))
  const excessTonnes = tonnes(Math.max(0, deliveredKg - highestKg))
  return {
    fruitContractId: input.fruitContractId,
    harvestYear: input.harvestYear,
    contractedTonnes: input.contractedTonnes,
    tolerancePct: input.tolerancePct,
    lowestTonnes: tonnes(lowestKg),
    highestTonnes: tonnes(highestKg),
    deliveredTonnes: tonnes(deliveredKg),
    shortfallTonnes,
    excessTonnes,
    cropFailure: input.cropFailure,
    shortfallMeans: shortfallMeaning(input.cropFailure, shortfallTonnes, input.harvestYear),
  }
}

/**
 * The kilograms of one load past the band's top, given what the year held before it (deliveries
 * in the order they were delivered): the part of the load above `highestKg`, never more than the load.
 */
export function excessOfLoad(highestKg: number, deliveredBeforeKg: number, netKg: number): number {
  const over = kg(deliveredBeforeKg + netKg - highestKg)
  return Math.min(kg(netKg), Math.max(0, over))
}
