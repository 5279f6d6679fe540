import type { BearingPace, OrganicStatus } from '../schemas/block'
import type { BearingCurve, ForecastByClass, YearKg } from '../utils/forecast'
import type { JuiceClass } from '../utils/juiceClass'

/** One planted block as the API answers it: SI units, the catalogue names joined in. */
export interface OrchardBlock {
  id: number
  name: string
  varietyId: number
  varietyName: string
  species: 'apple' | 'pear'
  juiceClass: JuiceClass
  rootstockId: number
  rootstockDesignation: string
  treeCount: number
  yearPlanted: number
  areaHa: number
  inRowM: number
  betweenRowM: number
  /** Trees per hectare the spacing gives (10,000 m² ÷ in-row × between-row). */
  densityPerHa: number
  organicStatus: OrganicStatus
  survivalRate: number
  /** Where in the rootstock's published range of bearing ages the forecast is taken. */
  bearingPace: BearingPace
  notes: string | null
  createdAt: string
  updatedAt: string
}

export interface BlockList {
  items: OrchardBlock[]
  total: number
  /** Over all the organisation's blocks, not only this page. */
  totals: { trees: number, areaHa: number }
}

export interface OrchardBlockDetail extends OrchardBlock {
  /** The rootstock's bearing curve, or null when the catalogue lacks a figure for it. */
  bearingCurve: BearingCurve | null
  /** Why the forecast is all zeros, when it is for want of catalogue figures. */
  forecastNote: string | null
  forecast: YearKg[]
}

export interface BlockWithoutCurve { id: number, name: string, rootstockDesignation: string, note: string }

export interface OrganisationForecast {
  startYear: number
  years: number[]
  byClass: ForecastByClass
  /** All classes added, per year. */
  totals: YearKg[]
  /** Blocks left out (counted as 0 kg) because their rootstock lacks bearing figures. */
  blocksWithoutCurve: BlockWithoutCurve[]
}
