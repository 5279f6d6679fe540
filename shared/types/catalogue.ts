import type { HarvestSeason, Species, Vigour } from '../schemas/catalogue'
import type { JuiceClass } from '../utils/juiceClass'

/** A catalogue variety as the API answers it. `juiceClass` is the published label, not a computed class. */
export interface Variety {
  id: number
  name: string
  species: Species
  juiceClass: JuiceClass
  typicalBrix: number | null
  /** g/L expressed as malic acid. */
  typicalTaGPerL: number | null
  typicalTanninGPerL: number | null
  harvestSeason: HarvestSeason | null
  /** Where the class and the figures come from; "from memory" marks unsourced values. */
  source: string | null
  createdAt: string
  updatedAt: string
}

/** A catalogue rootstock as the API answers it: SI units. */
export interface Rootstock {
  id: number
  designation: string
  species: Species
  vigour: Vigour
  sizePctOfSeedling: number | null
  needsSupport: boolean
  inRowM: number | null
  betweenRowM: number | null
  yearsToFirstCrop: number | null
  yearsToFullBearing: number | null
  yieldPerTreeKg: number | null
  source: string | null
  createdAt: string
  updatedAt: string
}

export interface VarietyList { items: Variety[], total: number }
export interface RootstockList { items: Rootstock[], total: number }
