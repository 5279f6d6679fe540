import type { HarvestSeason, Species, Vigour } from '../schemas/catalogue'
import type { JuiceClass } from '../utils/juiceClass'

/**
 * A catalogue variety's own fields, shared by the API answer and the seed data. `juiceClass` is
 * the published label, not a computed class.
 */
export interface VarietyFields {
  name: string
  species: Species
  juiceClass: JuiceClass
  /** Typical juice sugar, °Brix (null when no source gives it). */
  typicalBrix: number | null
  /** Typical titratable acidity, g/L expressed as malic acid. */
  typicalTaGPerL: number | null
  /** Typical tannin, g/L. */
  typicalTanninGPerL: number | null
  harvestSeason: HarvestSeason | null
  /** Where the class and the figures come from; "from memory" marks unsourced values. */
  source: string | null
}

/** A catalogue variety as the API answers it. */
export interface Variety extends VarietyFields {
  id: number
  createdAt: string
  updatedAt: string
}

/** A catalogue rootstock's own fields in SI units, shared by the API answer and the seed data. */
export interface RootstockFields {
  designation: string
  species: Species
  vigour: Vigour
  /** Mature tree size as % of a tree on seedling rootstock. */
  sizePctOfSeedling: number | null
  needsSupport: boolean
  /** Typical spacing within the row, m. */
  inRowM: number | null
  /** Typical spacing between rows, m. */
  betweenRowM: number | null
  /** Years to first crop, the early end of the published range. */
  yearsToFirstCrop: number | null
  /** The late end of that range; null when the source gives one figure. */
  yearsToFirstCropLate: number | null
  /** Years to full bearing of a tree that starts cropping at the early end. */
  yearsToFullBearing: number | null
  /** Yield per tree at full bearing, kg. */
  yieldPerTreeKg: number | null
  source: string | null
}

/** A catalogue rootstock as the API answers it. */
export interface Rootstock extends RootstockFields {
  id: number
  createdAt: string
  updatedAt: string
}

export interface VarietyList { items: Variety[], total: number }
export interface RootstockList { items: Rootstock[], total: number }
