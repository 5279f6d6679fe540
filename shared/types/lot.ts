import type { FruitSpecies, JuiceClass } from '../utils/juiceClass'

// Harvest lots, their juice readings and the lab sheets they came from, as the API answers them:
// SI units (kg, g/L, mg/L, °C), dates as YYYY-MM-DD.

export const LOT_STATES = ['available', 'delivered', 'pressed'] as const
export type LotState = typeof LOT_STATES[number]

export const TA_ACIDS = ['malic', 'tartaric', 'sulfuric'] as const
export type TaAcid = typeof TA_ACIDS[number]
export const TA_UNITS = ['g/L', '% w/v'] as const
export type TaUnit = typeof TA_UNITS[number]
export const TANNIN_UNITS = ['g/L', '%', 'mg/L'] as const
export type TanninUnit = typeof TANNIN_UNITS[number]

export interface JuiceReading {
  id: number
  lotId: number
  /** The sheet it was imported from, or null when typed by hand. */
  labSheetId: number | null
  sheetRow: number | null
  sampledOn: string
  brix: number | null
  /** Corrected to the organisation's hydrometer calibration temperature. */
  sg: number | null
  sgAsRead: number | null
  tempC: number | null
  /** Titratable acidity as malic acid. */
  taGPerL: number | null
  taReportedAs: TaAcid | null
  taReportedValue: number | null
  taReportedUnit: TaUnit | null
  ph: number | null
  tanninGPerL: number | null
  yanMgPerL: number | null
  notes: string | null
  /** From TA and tannin, by the lot's species' thresholds; null without both. */
  juiceClass: JuiceClass | null
  createdAt: string
}

export interface HarvestLot {
  id: number
  orgId: number
  orgName: string
  code: string
  blockId: number | null
  blockName: string | null
  varietyId: number
  varietyName: string
  species: FruitSpecies
  /** The variety's published class. */
  varietyClass: JuiceClass
  pickedOn: string
  harvestYear: number
  netKg: number
  bins: number | null
  notes: string | null
  state: LotState
  latestReading: JuiceReading | null
  /** The latest reading's class, else null. */
  juiceClass: JuiceClass | null
  createdAt: string
  updatedAt: string
}

export interface LabSheet {
  id: number
  name: string
  sha256: string
  sizeBytes: number
  contentType: string
  kind: 'csv' | 'xlsx' | 'pdf'
  headers: string[] | null
  uploadedByName: string
  uploadedAt: string
  importedAt: string | null
  importedCount: number | null
  skippedCount: number | null
}
