import type { AcidityByAcid } from '../utils/acid'
import type { AlcoholMethod } from '../utils/alcohol'
import type { BackPlanStep, DeliverySeason, TreeType } from '../utils/backplan'
import type { Hemisphere } from '../utils/hemisphere'
import type { JuiceClass } from '../utils/juiceClass'
import type { PotentialAlcoholMethod } from '../schemas/calc'

// What the public calculators answer. Numbers are unrounded; pages round them for display.

export interface SugarResult {
  brix: number
  /** Apparent SG 20/20 °C, as a hydrometer reads it. */
  sgApparent: number
  /** True (in vacuo) SG 20/20 °C. */
  sgTrue: number
  plato: number
  /** Every soluble solid counted as sugar (°Bx × density × 10): an upper bound on the sugar. */
  solubleSolidsGPerL: number
  /** Fermentable sugar from the OIV refractometry table. */
  sugarGPerL: number
  /** True when °Brix lies outside the table's rows (10–21.5 °Bx) and the sugar is carried on from its end. */
  sugarExtrapolated: boolean
  /** % vol, by `method`. */
  potentialAbv: number
  method: PotentialAlcoholMethod
}

export interface AlcoholResult {
  /** % vol. */
  abv: number
  method: AlcoholMethod
}

/** Titratable acidity in g/L expressed as each acid. */
export type AcidResult = AcidityByAcid

export interface ClassResult {
  juiceClass: JuiceClass
  /** Whose thresholds were used: the apple (Long Ashton) or the perry pear (Pollard & Beech) ones. */
  species: 'apple' | 'pear'
}

export interface PlantingResult {
  treesPerHectare: number
  treesPerAcre: number
}

export interface BackPlanResult {
  deliveryYear: number
  season: DeliverySeason
  trees: number
  treeType: TreeType
  /** Double-worked on an interstem. */
  interstem: boolean
  /** The hemisphere whose season the dates fall in. */
  hemisphere: Hemisphere
  /** Rootstocks to bud: trees ÷ (take × survival), rounded up. */
  rootstocksToBud: number
  /** Each propagation step the tree type has and the date (YYYY-MM-DD) it must be done by, in order. */
  steps: BackPlanStep[]
}
