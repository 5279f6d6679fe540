import { BED_RECORDS_BY_KIND, type BedKind, type BedRecordKind } from '../schemas/nursery'
import type { Hemisphere } from './hemisphere'

// Which facts each kind of nursery bed and each yearly record carries. The server refuses a bed or
// a record that lacks a fact its kind needs, or sends one that does not apply (naming the field);
// the forms read the same tables to show only the boxes a kind needs.

/** A field at fault and why, in the shape of a refusal's `data.issues`. */
export interface RuleIssue { path: string, message: string }

export type BedField = 'rootstockId' | 'motherPlants' | 'yearEstablished' | 'seedSource'
export const BED_FIELDS: readonly BedField[] = ['rootstockId', 'motherPlants', 'yearEstablished', 'seedSource']

export const BED_KIND_LABELS: Record<BedKind, string> = {
  stool: 'Stool bed',
  cutting: 'Cutting bed',
  seedling: 'Seedling bed',
  field: 'Nursery-row field',
}

/**
 * The facts a bed of each kind must name, and those it may. A stool bed's mother plants make the
 * rootstock it is named for (and stay productive for 20 years or more, so its year established
 * says how old they are); a cutting bed roots one clonal rootstock; a seedling bed is known by its
 * seed, and may name the catalogue's seedling stock its liners are lifted as; a nursery-row field
 * holds rows and runs, whose own records say what grows there.
 */
export const BED_FIELDS_BY_KIND: Record<BedKind, { required: readonly BedField[], optional: readonly BedField[] }> = {
  stool: { required: ['rootstockId', 'motherPlants', 'yearEstablished'], optional: [] },
  cutting: { required: ['rootstockId'], optional: ['yearEstablished'] },
  seedling: { required: ['seedSource'], optional: ['rootstockId', 'yearEstablished'] },
  field: { required: [], optional: [] },
}

const BED_FIELD_NAMES: Record<BedField, string> = {
  rootstockId: 'rootstock',
  motherPlants: 'mother plants',
  yearEstablished: 'year established',
  seedSource: 'seed source',
}

const BED_FIELD_NEEDED: Record<BedField, string> = {
  rootstockId: 'Choose the rootstock the bed grows',
  motherPlants: 'Enter the number of mother plants',
  yearEstablished: 'Enter the year the bed was established',
  seedSource: 'Enter where the seed came from',
}

/** Whether a bed of this kind has the field at all. */
export function bedFieldApplies(kind: BedKind, field: BedField): boolean {
  const { required, optional } = BED_FIELDS_BY_KIND[kind]
  return required.includes(field) || optional.includes(field)
}

/**
 * What is wrong with a bed's facts for its kind: each field the kind needs that is empty, and each
 * field given that the kind does not have. `sent` limits the second check to the fields a request
 * sent (a patch), so a stored null is never reported.
 */
export function bedFieldIssues(kind: BedKind, values: Partial<Record<BedField, unknown>>, sent: readonly BedField[] = BED_FIELDS): RuleIssue[] {
  const issues: RuleIssue[] = []
  const label = BED_KIND_LABELS[kind].toLowerCase()
  for (const field of BED_FIELDS) {
    const value = values[field]
    const given = value !== null && value !== undefined
    if (BED_FIELDS_BY_KIND[kind].required.includes(field) && !given) {
      issues.push({ path: field, message: `${BED_FIELD_NEEDED[field]}: a ${label} names it` })
    }
    else if (!bedFieldApplies(kind, field) && given && sent.includes(field)) {
      issues.push({ path: field, message: `A ${label} has no ${BED_FIELD_NAMES[field]}: leave it empty` })
    }
  }
  return issues
}

// ----- Yearly records -----

export type BedRecordField = 'count' | 'grade' | 'hormone' | 'hormoneStrength'
export const BED_RECORD_FIELDS: readonly BedRecordField[] = ['count', 'grade', 'hormone', 'hormoneStrength']

export const BED_RECORD_LABELS: Record<BedRecordKind, string> = {
  'cut-back': 'Cut back',
  'earthed-up': 'Earthed up',
  'liners-lifted': 'Liners lifted',
  'cuttings-stuck': 'Cuttings stuck',
  'rooted': 'Cuttings rooted',
  'seedlings-raised': 'Seedlings raised',
}

/**
 * The facts each record needs; none of the others applies. Liners are lifted and graded by stem
 * diameter; cuttings are stuck with a rooting hormone at a strength; rooted cuttings and raised
 * seedlings are counted; cutting back and earthing up are dated work only.
 */
export const BED_RECORD_FIELDS_BY_KIND: Record<BedRecordKind, readonly BedRecordField[]> = {
  'cut-back': [],
  'earthed-up': [],
  'liners-lifted': ['count', 'grade'],
  'cuttings-stuck': ['count', 'hormone', 'hormoneStrength'],
  'rooted': ['count'],
  'seedlings-raised': ['count'],
}

const RECORD_FIELD_NEEDED: Record<BedRecordField, string> = {
  count: 'Enter the count',
  grade: 'Choose the stem diameter grade',
  hormone: 'Enter the rooting hormone',
  hormoneStrength: 'Enter the hormone strength',
}

const RECORD_FIELD_NAMES: Record<BedRecordField, string> = {
  count: 'count',
  grade: 'grade',
  hormone: 'rooting hormone',
  hormoneStrength: 'hormone strength',
}

/** What is wrong with a record for this bed: a kind the bed does not keep, a missing fact, or one that does not apply. */
export function bedRecordIssues(bedKind: BedKind, record: { kind: BedRecordKind } & Partial<Record<BedRecordField, unknown>>): RuleIssue[] {
  const allowed = BED_RECORDS_BY_KIND[bedKind]
  const label = BED_KIND_LABELS[bedKind].toLowerCase()
  if (!allowed.includes(record.kind)) {
    const message = allowed.length
      ? `A ${label} keeps ${allowed.map(k => BED_RECORD_LABELS[k].toLowerCase()).join(', ')} records`
      : `A ${label} keeps no yearly records: its rows and runs do`
    return [{ path: 'kind', message }]
  }
  const needed = BED_RECORD_FIELDS_BY_KIND[record.kind]
  const issues: RuleIssue[] = []
  for (const field of BED_RECORD_FIELDS) {
    const value = record[field]
    const given = value !== null && value !== undefined
    if (needed.includes(field) && !given) issues.push({ path: field, message: `${RECORD_FIELD_NEEDED[field]}: ${BED_RECORD_LABELS[record.kind].toLowerCase()} needs it` })
    else if (!needed.includes(field) && given) issues.push({ path: field, message: `${BED_RECORD_LABELS[record.kind]} has no ${RECORD_FIELD_NAMES[field]}: leave it empty` })
  }
  return issues
}

// ----- Seasons -----

/**
 * The nursery season a date falls in. In the north a stool bed is cut back in spring, earthed up
 * in summer and its liners lifted in late autumn, all in one calendar year: the season is the year.
 * In the south the same work runs from spring in September to autumn in May, across the new year,
 * so a season runs July to June and is named by both years ("2025–26").
 */
export function nurserySeason(doneOn: string, hemisphere: Hemisphere = 'north'): string {
  const year = Number(doneOn.slice(0, 4))
  const month = Number(doneOn.slice(5, 7))
  if (hemisphere === 'north') return String(year)
  const start = month >= 7 ? year : year - 1
  return `${start}–${String((start + 1) % 100).padStart(2, '0')}`
}
