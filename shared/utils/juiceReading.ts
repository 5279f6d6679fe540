// One juice reading as a person or a lab sheet gives it → the figures Pomewright stores
// (juice_readings): °Brix, SG corrected to the hydrometer's calibration temperature, TA as malic
// acid in g/L, tannin in g/L, YAN in mg/L, pH. Impossible values for a juice come back as issues
// naming the field, never as a stored reading.

import { convertAcid, type Acid } from './acid'
import { correctHydrometerSg } from './hydrometer'
import { juiceClass, type FruitSpecies, type JuiceClass } from './juiceClass'
import { sgToBrix } from './sugar'

export const TA_ACIDS_OF_READING = ['malic', 'tartaric', 'sulfuric'] as const
export const TA_UNITS_OF_READING = ['g/L', '% w/v'] as const
export const TANNIN_UNITS_OF_READING = ['g/L', '%', 'mg/L'] as const
export type ReadingTaUnit = typeof TA_UNITS_OF_READING[number]
export type ReadingTanninUnit = typeof TANNIN_UNITS_OF_READING[number]

/**
 * What a juice can be. °Brix, SG and pH: the outer edges of apple and pear juices, with a margin
 * (common practice; cider juices run about SG 1.045–1.060 and pH 3.3–3.8, see REFERENCES.md). The
 * upper limits of TA, tannin and YAN are far beyond any fruit juice (from memory) and keep a typing
 * slip out of the records. Temperature: the range a juice is read at.
 */
export const READING_LIMITS = {
  brix: { min: 0, max: 32 },
  sg: { min: 1.0, max: 1.14 },
  ph: { min: 2.5, max: 5.0 },
  tempC: { min: 0, max: 40 },
  taGPerL: { min: 0, max: 40 },
  tanninGPerL: { min: 0, max: 20 },
  yanMgPerL: { min: 0, max: 2000 },
} as const

/** °Brix and SG (as °Brix by sgToBrix) may differ by this much before the reading is refused. */
export const BRIX_SG_TOLERANCE_BRIX = 0.5

export interface RawReading {
  brix?: number | null
  sg?: number | null
  tempC?: number | null
  ta?: number | null
  taAs?: Acid | null
  taUnit?: ReadingTaUnit | null
  ph?: number | null
  tannin?: number | null
  tanninUnit?: ReadingTanninUnit | null
  yan?: number | null
}

/** The measured columns of juice_readings (camelCase). */
export interface NormalisedReading {
  brix: number | null
  sg: number | null
  sgAsRead: number | null
  tempC: number | null
  taGPerL: number | null
  taReportedAs: Acid | null
  taReportedValue: number | null
  taReportedUnit: ReadingTaUnit | null
  ph: number | null
  tanninGPerL: number | null
  yanMgPerL: number | null
}

export interface ReadingIssue {
  field: keyof RawReading
  message: string
}

export type NormaliseResult = { ok: true, reading: NormalisedReading } | { ok: false, issues: ReadingIssue[] }

export interface NormaliseOptions {
  /** The organisation's hydrometer calibration temperature, °C. */
  calibrationC: number
  species: FruitSpecies
}

const TANNIN_TO_G_PER_L: Record<ReadingTanninUnit, number> = { 'g/L': 1, '%': 10, 'mg/L': 0.001 }
/** % w/v is grams per 100 mL: × 10 is g/L. */
const TA_TO_G_PER_L: Record<ReadingTaUnit, number> = { 'g/L': 1, '% w/v': 10 }

const present = (v: number | null | undefined): v is number => v !== null && v !== undefined

function fmt(n: number, digits: number): string {
  return n.toFixed(digits)
}

export function normaliseReading(raw: RawReading, { calibrationC }: NormaliseOptions): NormaliseResult {
  const issues: ReadingIssue[] = []
  const L = READING_LIMITS

  const inRange = (field: keyof RawReading, value: number, min: number, max: number, label: string, unit = ''): boolean => {
    if (!Number.isFinite(value)) {
      issues.push({ field, message: `${label} must be a number` })
      return false
    }
    if (value < 0) {
      issues.push({ field, message: `${label} cannot be negative; got ${value}` })
      return false
    }
    if (value < min || value > max) {
      issues.push({ field, message: `${label} of a juice is from ${min} to ${max}${unit}; got ${value}` })
      return false
    }
    return true
  }

  const { brix, sg, tempC, ta, ph, tannin, yan } = raw
  const measured = [brix, sg, ta, ph, tannin, yan].some(present)
  if (!measured) {
    return { ok: false, issues: [{ field: 'brix', message: 'Nothing measured: give at least one of °Brix, SG, TA, pH, tannin or YAN' }] }
  }

  const brixOk = present(brix) && inRange('brix', brix, L.brix.min, L.brix.max, '°Brix')
  const sgOk = present(sg) && inRange('sg', sg, L.sg.min, L.sg.max, 'SG')
  const tempOk = present(tempC) && inRange('tempC', tempC, L.tempC.min, L.tempC.max, 'The temperature', ' °C')
  if (present(ph)) inRange('ph', ph, L.ph.min, L.ph.max, 'pH')

  let sgCorrected: number | null = sgOk ? sg : null
  if (sgOk && tempOk) sgCorrected = correctHydrometerSg(sg, tempC, calibrationC)

  if (brixOk && sgCorrected !== null) {
    const brixOfSg = sgToBrix(Math.min(Math.max(sgCorrected, 1), L.sg.max))
    if (Math.abs(brixOfSg - brix) > BRIX_SG_TOLERANCE_BRIX) {
      issues.push({
        field: 'sg',
        message: `°Brix and SG disagree by more than ${BRIX_SG_TOLERANCE_BRIX} °Brix: °Brix gives ${fmt(brix, 1)}, `
          + `SG ${fmt(sgCorrected, 4)} gives ${fmt(brixOfSg, 1)} °Brix`,
      })
    }
  }

  let taGPerL: number | null = null
  if (present(ta)) {
    const unit = raw.taUnit ?? 'g/L'
    const as = raw.taAs ?? 'malic'
    if (Number.isFinite(ta) && ta < 0) issues.push({ field: 'ta', message: `TA cannot be negative; got ${ta}` })
    else if (Number.isFinite(ta)) {
      const malic = convertAcid(ta * TA_TO_G_PER_L[unit], as).malic
      if (inRange('ta', malic, L.taGPerL.min, L.taGPerL.max, 'TA as malic', ' g/L')) taGPerL = malic
    }
    else issues.push({ field: 'ta', message: 'TA must be a number' })
  }

  let tanninGPerL: number | null = null
  if (present(tannin)) {
    const gPerL = tannin * TANNIN_TO_G_PER_L[raw.tanninUnit ?? 'g/L']
    if (inRange('tannin', gPerL, L.tanninGPerL.min, L.tanninGPerL.max, 'Tannin', ' g/L')) tanninGPerL = gPerL
  }

  if (present(yan)) inRange('yan', yan, L.yanMgPerL.min, L.yanMgPerL.max, 'YAN', ' mg/L')

  if (issues.length) return { ok: false, issues }
  return {
    ok: true,
    reading: {
      brix: present(brix) ? brix : null,
      sg: sgCorrected,
      sgAsRead: present(sg) ? sg : null,
      tempC: present(tempC) ? tempC : null,
      taGPerL,
      taReportedAs: present(ta) ? raw.taAs ?? 'malic' : null,
      taReportedValue: present(ta) ? ta : null,
      taReportedUnit: present(ta) ? raw.taUnit ?? 'g/L' : null,
      ph: present(ph) ? ph : null,
      tanninGPerL,
      yanMgPerL: present(yan) ? yan : null,
    },
  }
}

/** A reading's juice class by its species' thresholds (pears by the perry pear classes); null without both TA and tannin. */
export function readingClass(reading: { taGPerL: number | null, tanninGPerL: number | null }, species: FruitSpecies): JuiceClass | null {
  if (reading.taGPerL === null || reading.tanninGPerL === null) return null
  return juiceClass(reading.taGPerL, reading.tanninGPerL, species)
}
