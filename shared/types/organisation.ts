import type { Currency, PressType } from '../schemas/organisation'
import type { OrganisationState } from '../utils/organisationStatus'
import type { ForecastClass } from '../utils/forecast'
import type { Hemisphere } from '../utils/hemisphere'
import type { OrgKind } from './auth'

/**
 * An organisation's settings as its own people read them. A maker's press fields and a nursery's
 * plant-health registration number are present only where they apply.
 */
export interface OrganisationSettings {
  id: number
  name: string
  kind: OrgKind
  isNursery: boolean
  status: OrganisationState
  region: string | null
  /** ISO 3166-1 alpha-2 (GB, IE, FR); a nursery's plant passports name it as the country of origin. */
  countryCode: string | null
  /** Shown in the directory. */
  description: string | null
  /** Shown to counterparties (the other party of a contract), never in the directory. */
  contactName: string | null
  contactPhone: string | null
  publicEmail: string | null
  /** Where the platform sends the organisation's account mail; private. */
  contactEmail: string | null
  hemisphere: Hemisphere
  currency: Currency
  taxRatePct: number | null
  listed: boolean
  hydrometerCalibrationC: number
  pressType?: PressType | null
  defaultJuiceYieldLPerT?: number | null
  plantHealthRegNo?: string | null
  /** Connected by the payments feature; read-only here. */
  paymentAccountId: string | null
  createdAt: string
  updatedAt: string
}

export interface DirectoryVariety { id: number, name: string, species: 'apple' | 'pear' }

/** A listed organisation as anyone signed in sees it: who it is and what it grows, none of its records. */
export interface DirectoryEntry {
  id: number
  name: string
  kind: OrgKind
  isNursery: boolean
  region: string | null
  description: string | null
  /** The distinct varieties of its orchard blocks, by name. */
  varieties: DirectoryVariety[]
  /** The distinct juice classes of those varieties (perry pears as "perry …"). */
  juiceClasses: ForecastClass[]
  /** What a nursery propagates: empty until nursery runs are recorded. */
  propagates: DirectoryVariety[]
}

export interface DirectoryList { items: DirectoryEntry[], total: number }
