// What a dispatch label says: the trees of a bundle, and the plant passport where the nursery is
// registered for one. Pure, so the label page and the server word a label the same way.
//
// The passport's four elements (Regulation (EU) 2016/2031, Annex VII; the format of Commission
// Implementing Regulation (EU) 2017/2313, kept for Great Britain as the UK plant passport):
//   A  the botanical name of the species
//   B  the two-letter code of the country where the operator is registered, a hyphen, and the
//      operator's registration number
//   C  a traceability code of the unit that moves (here: the bundle)
//   D  the two-letter code of the country of origin
// They stand inside a border line, apart from anything else on the label.

export type PassportSpecies = 'apple' | 'pear'

/**
 * The botanical name per species (USDA ARS GRIN Taxonomy: Malus domestica Borkh., nomen 104681;
 * Pyrus communis L.). Perry pears are Pyrus communis too; a pear worked on quince is named by
 * its variety's species.
 */
export const BOTANICAL_NAMES: Record<PassportSpecies, string> = {
  apple: 'Malus domestica',
  pear: 'Pyrus communis',
}

/** Trees tied in one bundle unless the nursery chooses otherwise (common practice). */
export const DEFAULT_BUNDLE_SIZE = 10
export const BUNDLE_SIZE_LIMITS = { min: 1, max: 100 } as const

export interface PassportFields {
  /** "UK plant passport" in Great Britain, "Plant passport" elsewhere. */
  heading: string
  /** A: botanical name. */
  botanicalName: string
  /** B: country code, hyphen, registration number ("GB-40917"). */
  operator: string
  /** C: the bundle's traceability code. */
  traceabilityCode: string
  /** D: country of origin. */
  origin: string
}

/** What the nursery's settings give for a passport; each may be missing. */
export interface PassportRegistration {
  plantHealthRegNo: string | null | undefined
  countryCode: string | null | undefined
}

export type PassportIssuer
  = | { ok: true, heading: string, operator: string, origin: string }
    | { ok: false, note: string }

// A registration written with its country in front: "GB-40917", "GB 40917", "gb/40917".
const PREFIXED = /^([A-Za-z]{2})\s*[-\s./]\s*(\S.*)$/

/**
 * Who issues the passport, from the nursery's registration and country, or why no passport can be
 * printed. A registration written with its country code in front keeps that code once (never
 * "GB-GB-40917"); without one it takes the organisation's country. The country of origin is the
 * organisation's country, or the registration's where the organisation has none set.
 */
export function passportIssuer(reg: PassportRegistration): PassportIssuer {
  const number = reg.plantHealthRegNo?.trim() ?? ''
  if (!number) return { ok: false, note: 'No plant passport: the nursery has no plant-health registration number in its settings, so these labels carry no passport. Trees for planting need one to move (in Great Britain, all of them).' }
  const own = reg.countryCode?.trim().toUpperCase() || null
  const prefixed = PREFIXED.exec(number)
  const written = prefixed ? prefixed[1]!.toUpperCase() : null
  // "GB40917": the organisation's own code run into the number.
  const runIn = !prefixed && own && number.toUpperCase().startsWith(own) && /^\d/.test(number.slice(2)) ? number.slice(2) : null
  const country = written ?? own
  if (!country) return { ok: false, note: 'No plant passport: set the organisation\'s country in its settings; the passport names the country of registration and of origin.' }
  const rest = prefixed ? prefixed[2]!.trim() : runIn ?? number
  return {
    ok: true,
    heading: country === 'GB' ? 'UK plant passport' : 'Plant passport',
    operator: `${country}-${rest}`,
    origin: own ?? country,
  }
}

/** The passport of one bundle, or null where the issuer could not be worked out. */
export function passportFields(issuer: PassportIssuer, species: PassportSpecies, traceabilityCode: string): PassportFields | null {
  if (!issuer.ok) return null
  return { heading: issuer.heading, botanicalName: BOTANICAL_NAMES[species], operator: issuer.operator, traceabilityCode, origin: issuer.origin }
}

/**
 * A bundle's traceability code: the run's tag code (unique to the run) and the bundle's number
 * within the run, so no two bundles of the nursery share one.
 */
export function traceabilityCode(tagCode: string, bundleNo: number): string {
  return `${tagCode}-${String(bundleNo).padStart(2, '0')}`
}

/** Trees of one grade tied in bundles of `size`: full bundles, the remainder in the last. */
export function splitIntoBundles(trees: number, size: number = DEFAULT_BUNDLE_SIZE): number[] {
  if (!Number.isInteger(trees) || trees < 0) throw new RangeError('trees must be a whole number, 0 or more')
  if (!Number.isInteger(size) || size < 1) throw new RangeError('a bundle holds a whole number of trees, 1 or more')
  const bundles = Array.from({ length: Math.floor(trees / size) }, () => size)
  if (trees % size) bundles.push(trees % size)
  return bundles
}

/** A grade of dug trees as the dig recorded it. */
export interface LabelGrade { caliperMm: number, heightCm: number | null, feathered: boolean }

/**
 * The grade in words: "13 mm caliper, 150 cm, feathered" or "11 mm caliper, whip" (a whip is
 * a tree with no side shoots; common practice).
 */
export function gradeInWords(grade: LabelGrade): string {
  const caliper = `${Number(grade.caliperMm.toFixed(1))} mm caliper`
  const height = grade.heightCm === null ? null : `${grade.heightCm} cm`
  return [caliper, height, grade.feathered ? 'feathered' : 'whip'].filter(Boolean).join(', ')
}

/** "spring 2027" */
export function deliveryInWords(year: number, season: string): string {
  return `${season} ${year}`
}
