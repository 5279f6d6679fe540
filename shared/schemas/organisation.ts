import { z } from 'zod'
import type { OrgKind } from '../types/auth'
import { FORECAST_CLASSES } from '../utils/forecast'
import { HEMISPHERES } from '../utils/hemisphere'
import { emailField } from './account'
import { blankAsMissing, numberInRange, optionalText, pageQuerySchema, requiredText, searchText, somethingToChange, withDecimals } from './fields'

// An organisation's settings, edited by its owners and read by its members and viewers, and the
// directory query. The settings form validates with the same schema the route does.

/**
 * Currencies an organisation may trade in (ISO 4217). Every one has two-decimal minor units,
 * since money is stored as integer minor units.
 */
export const CURRENCIES = ['GBP', 'EUR', 'USD', 'CAD', 'AUD', 'NZD', 'CHF', 'SEK', 'NOK', 'DKK', 'ZAR'] as const
export type Currency = typeof CURRENCIES[number]

export const PRESS_TYPES = ['basket', 'rack-and-cloth', 'belt', 'pneumatic', 'screw', 'other'] as const
export type PressType = typeof PRESS_TYPES[number]

export const PRESS_TYPE_LABELS: Record<PressType, string> = {
  'basket': 'Basket press',
  'rack-and-cloth': 'Rack-and-cloth press',
  'belt': 'Belt press',
  'pneumatic': 'Pneumatic (bladder) press',
  'screw': 'Screw press',
  'other': 'Other',
}

// Limits that catch typing slips without refusing any real figure. A tonne of fruit gives at most
// about 950 L of juice (juice is about 1.05 kg/L); most presses give 400–850 L (common practice).
// Hydrometers are calibrated at 15.56 °C (60 °F) or 20 °C (from memory); 10–30 °C leaves room.
export const SETTINGS_LIMITS = {
  nameLength: 160,
  regionLength: 120,
  descriptionLength: 500,
  contactNameLength: 120,
  phoneLength: 40,
  emailLength: 254,
  plantHealthLength: 40,
  taxRatePct: { min: 0, max: 100 },
  juiceYieldLPerT: { min: 200, max: 950 },
  calibrationC: { min: 10, max: 30 },
  searchLength: 120,
} as const

/** Fields only a maker has. */
export const MAKER_SETTINGS = ['pressType', 'defaultJuiceYieldLPerT'] as const
/** Fields only an organisation that runs a nursery has. */
export const NURSERY_SETTINGS = ['plantHealthRegNo'] as const

/**
 * Fields the settings answer carries that no one edits here (the payments feature connects the
 * payment account): sent back with a patch they are ignored, not refused.
 */
export const READ_ONLY_SETTINGS = ['id', 'kind', 'isNursery', 'status', 'paymentAccountId', 'paymentCustomerId', 'createdAt', 'updatedAt'] as const

const PHONE = /^\+?[0-9][0-9 ()./-]*$/

const phone = optionalText('Enter the phone number as text', SETTINGS_LIMITS.phoneLength)
  .refine(v => v === null || (PHONE.test(v) && v.replace(/\D/g, '').length >= 5), { message: 'Enter a phone number: digits, spaces, brackets, dashes, an optional leading +' })

const publicEmail = optionalText('Enter the e-mail address as text', SETTINGS_LIMITS.emailLength)
  .refine(v => v === null || z.email().safeParse(v).success, { message: 'Enter a valid e-mail address, or leave it empty' })

// A plant-health (plant passport) registration number: a country code and the number, e.g. GB-12345.
const PLANT_HEALTH = /^[A-Za-z0-9][A-Za-z0-9 ./-]*$/
const plantHealthRegNo = optionalText('Enter the registration number as text', SETTINGS_LIMITS.plantHealthLength)
  .refine(v => v === null || PLANT_HEALTH.test(v), { message: 'Use letters, digits, spaces, dashes, dots or slashes (e.g. GB-12345)' })

// The country the organisation works in, as its ISO 3166-1 alpha-2 code (GB, IE, FR): a nursery's
// plant passports name it as the country of origin.
const COUNTRY_CODE = /^[A-Z]{2}$/
const countryCode = optionalText('Enter the country code as text', 40)
  .refine(v => v === null || COUNTRY_CODE.test(v), { message: 'Enter the country as two capital letters (ISO 3166-1), e.g. GB or IE, or leave it empty' })

const settingsFields = {
  name: requiredText('the organisation’s name', SETTINGS_LIMITS.nameLength),
  region: optionalText('Enter the region as text', SETTINGS_LIMITS.regionLength),
  countryCode,
  description: optionalText('Enter the description as text', SETTINGS_LIMITS.descriptionLength),
  contactName: optionalText('Enter the contact’s name as text', SETTINGS_LIMITS.contactNameLength),
  contactPhone: phone,
  publicEmail,
  contactEmail: emailField,
  hemisphere: z.enum(HEMISPHERES, { message: 'Choose north or south' }),
  currency: z.enum(CURRENCIES, { message: `Choose one of ${CURRENCIES.join(', ')}` }),
  taxRatePct: withDecimals(numberInRange(SETTINGS_LIMITS.taxRatePct, 'Enter a tax rate from 0 to 100 %, or leave it empty'), 2, 'Use at most 2 decimals').nullable(),
  listed: z.boolean({ message: 'Say whether the organisation is listed in the directory' }),
  hydrometerCalibrationC: withDecimals(numberInRange(SETTINGS_LIMITS.calibrationC, 'Enter a calibration temperature from 10 to 30 °C'), 2, 'Use at most 2 decimals'),
  pressType: z.enum(PRESS_TYPES, { message: 'Choose basket, rack-and-cloth, belt, pneumatic, screw or other' }).nullable(),
  defaultJuiceYieldLPerT: withDecimals(numberInRange(SETTINGS_LIMITS.juiceYieldLPerT, 'Enter a yield from 200 to 950 L per tonne, or leave it empty'), 2, 'Use at most 2 decimals').nullable(),
  plantHealthRegNo,
}

export type SettingsField = keyof typeof settingsFields
export const SETTINGS_FIELDS = Object.keys(settingsFields) as SettingsField[]

/** What decides which settings apply: the organisation's kind and whether it runs a nursery. */
export interface SettingsOwner { kind: OrgKind, isNursery: boolean }

/** Why a field does not apply to this organisation, or null when it does. */
export function settingNotApplicable(field: SettingsField, org: SettingsOwner): string | null {
  if ((MAKER_SETTINGS as readonly string[]).includes(field) && org.kind !== 'maker') return 'Only makers record a press and its juice yield'
  if ((NURSERY_SETTINGS as readonly string[]).includes(field) && !org.isNursery) return 'Only organisations that run a nursery record a plant-health registration number'
  return null
}

/** The settings this organisation has. */
export function settingsFieldsFor(org: SettingsOwner): SettingsField[] {
  return SETTINGS_FIELDS.filter(field => !settingNotApplicable(field, org))
}

function withoutReadOnly(value: unknown): unknown {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return value
  return Object.fromEntries(Object.entries(value).filter(([key]) => !(READ_ONLY_SETTINGS as readonly string[]).includes(key)))
}

const notASetting = z.unknown().refine(() => false, { message: 'Not a setting that can be changed' })

/**
 * A settings patch for this organisation: every field optional; read-only keys dropped; an unknown
 * key, or a field that does not apply to the organisation, refused with the field named.
 */
export function organisationPatchSchema(org: SettingsOwner) {
  const shape = Object.fromEntries(SETTINGS_FIELDS.map((field) => {
    const reason = settingNotApplicable(field, org)
    return [field, reason ? z.never({ message: reason }).optional() : settingsFields[field].optional()]
  })) as { [K in SettingsField]: z.ZodOptional<typeof settingsFields[K]> }
  return z.preprocess(withoutReadOnly, z.object(shape).catchall(notASetting)
    .refine(somethingToChange, { message: 'Nothing to change' }))
}
export type OrganisationPatchInput = Partial<{ [K in SettingsField]: z.output<typeof settingsFields[K]> }>

// ----- The directory -----

function filter<T extends readonly [string, ...string[]]>(values: T, message: string) {
  return z.preprocess(blankAsMissing, z.enum(values, { message }).optional())
}

export const directoryQuerySchema = pageQuerySchema.extend({
  /** Part of the organisation's name. */
  q: searchText(SETTINGS_LIMITS.searchLength),
  /** Part of the region. */
  region: searchText(SETTINGS_LIMITS.searchLength),
  /** A variety grown, by catalogue id or part of its name. */
  variety: searchText(SETTINGS_LIMITS.searchLength),
  /** A juice class grown (perry pears as "perry …"). */
  juiceClass: filter(FORECAST_CLASSES, `Choose one of ${FORECAST_CLASSES.join(', ')}`),
  kind: filter(['grower', 'maker'] as const, 'Choose grower or maker'),
  /** Only organisations that run a nursery. */
  nursery: z.preprocess(blankAsMissing, z.enum(['true', 'false'], { message: 'Say true or false' }).transform(v => v === 'true').optional()),
})
export type DirectoryQuery = z.infer<typeof directoryQuerySchema>
