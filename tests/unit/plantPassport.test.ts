import { describe, expect, it } from 'vitest'
import {
  BOTANICAL_NAMES, DEFAULT_BUNDLE_SIZE, deliveryInWords, gradeInWords, passportFields, passportIssuer, splitIntoBundles, traceabilityCode,
} from '#shared/utils/plantPassport'

describe('botanical names', () => {
  it('names the apple Malus domestica and the pear Pyrus communis', () => {
    // USDA ARS GRIN Taxonomy: Malus domestica Borkh. (nomen 104681); Pyrus communis L.
    expect(BOTANICAL_NAMES.apple).toBe('Malus domestica')
    expect(BOTANICAL_NAMES.pear).toBe('Pyrus communis')
  })
})

describe('the passport issuer (element B) and the country of origin (element D)', () => {
  // Regulation (EU) 2016/2031 Annex VII and Implementing Regulation (EU) 2017/2313: B is the
  // two-letter country code, a hyphen, then the operator's registration number; D the two-letter
  // code of the country of origin.
  it('keeps a registration written with its country in front as it is, never doubling the code', () => {
    const issuer = passportIssuer({ plantHealthRegNo: 'GB-40917', countryCode: 'GB' })
    expect(issuer).toEqual({ ok: true, heading: 'UK plant passport', operator: 'GB-40917', origin: 'GB' })
  })

  it('puts the organisation\'s country in front of a bare number, with a hyphen', () => {
    expect(passportIssuer({ plantHealthRegNo: '40917', countryCode: 'GB' })).toMatchObject({ ok: true, operator: 'GB-40917', origin: 'GB' })
  })

  it('reads a country code written with a space, a slash or in small letters, or run into the number', () => {
    // Regulation (EU) 2017/2313: one form, "GB-40917", however the number was typed in.
    expect(passportIssuer({ plantHealthRegNo: 'GB 40917', countryCode: 'GB' })).toMatchObject({ operator: 'GB-40917' })
    expect(passportIssuer({ plantHealthRegNo: 'gb/40917', countryCode: 'GB' })).toMatchObject({ operator: 'GB-40917' })
    expect(passportIssuer({ plantHealthRegNo: 'GB40917', countryCode: 'GB' })).toMatchObject({ operator: 'GB-40917' })
  })

  it('takes the registration\'s own country where the organisation has none set, for both B and D', () => {
    expect(passportIssuer({ plantHealthRegNo: 'IE-3318', countryCode: null })).toEqual({ ok: true, heading: 'Plant passport', operator: 'IE-3318', origin: 'IE' })
  })

  it('heads a passport issued in Great Britain "UK plant passport", elsewhere "Plant passport"', () => {
    // UK plant passports since 2021 carry the heading "UK plant passport" (from memory, GB guidance).
    expect(passportIssuer({ plantHealthRegNo: '40917', countryCode: 'GB' })).toMatchObject({ heading: 'UK plant passport' })
    expect(passportIssuer({ plantHealthRegNo: '20-1188', countryCode: 'FR' })).toMatchObject({ heading: 'Plant passport', operator: 'FR-20-1188', origin: 'FR' })
  })

  it('prints no passport without a registration, and says why', () => {
    for (const plantHealthRegNo of [null, undefined, '', '   ']) {
      const issuer = passportIssuer({ plantHealthRegNo, countryCode: 'GB' })
      expect(issuer.ok).toBe(false)
      if (!issuer.ok) expect(issuer.note).toMatch(/no plant-health registration number/)
    }
  })

  it('prints no passport when neither the registration nor the settings give a country, and says why', () => {
    const issuer = passportIssuer({ plantHealthRegNo: '40917', countryCode: null })
    expect(issuer.ok).toBe(false)
    if (!issuer.ok) expect(issuer.note).toMatch(/country/)
  })
})

describe('the passport of a bundle (elements A to D)', () => {
  it('fills the four elements from the species, the issuer and the bundle\'s code', () => {
    const issuer = passportIssuer({ plantHealthRegNo: 'GB-40917', countryCode: 'GB' })
    // Regulation (EU) 2016/2031 Annex VII: A botanical name, B operator, C traceability code, D origin.
    expect(passportFields(issuer, 'apple', 'K7M2Q9XB4T-03')).toEqual({
      heading: 'UK plant passport', botanicalName: 'Malus domestica', operator: 'GB-40917', traceabilityCode: 'K7M2Q9XB4T-03', origin: 'GB',
    })
    expect(passportFields(issuer, 'pear', 'K7M2Q9XB4T-04')?.botanicalName).toBe('Pyrus communis')
  })

  it('is null where there is no registration', () => {
    expect(passportFields(passportIssuer({ plantHealthRegNo: null, countryCode: 'GB' }), 'apple', 'X-01')).toBeNull()
  })
})

describe('traceability codes', () => {
  it('joins the run\'s tag code and the bundle number, two digits at least', () => {
    // The code is ours (common practice: one code per unit that moves, here a bundle).
    expect(traceabilityCode('K7M2Q9XB4T', 1)).toBe('K7M2Q9XB4T-01')
    expect(traceabilityCode('K7M2Q9XB4T', 12)).toBe('K7M2Q9XB4T-12')
    expect(traceabilityCode('K7M2Q9XB4T', 123)).toBe('K7M2Q9XB4T-123')
  })

  it('gives every bundle of a run its own code', () => {
    const codes = Array.from({ length: 250 }, (_, i) => traceabilityCode('K7M2Q9XB4T', i + 1))
    expect(new Set(codes).size).toBe(250)
  })
})

describe('bundles', () => {
  it('ties ten trees to a bundle unless told otherwise', () => {
    // Ten finished trees to a bundle (common practice).
    expect(DEFAULT_BUNDLE_SIZE).toBe(10)
    expect(splitIntoBundles(30)).toEqual([10, 10, 10])
  })

  it('puts the remainder in the last bundle', () => {
    // Worked by hand: 183 = 7 × 25 + 8.
    expect(splitIntoBundles(183, 25)).toEqual([25, 25, 25, 25, 25, 25, 25, 8])
    expect(splitIntoBundles(7, 10)).toEqual([7])
    expect(splitIntoBundles(1, 1)).toEqual([1])
  })

  it('makes no bundle of no trees, and never loses or adds a tree', () => {
    expect(splitIntoBundles(0, 10)).toEqual([])
    for (const [trees, size] of [[412, 10], [99, 7], [1000, 50], [3, 100]] as const) {
      const bundles = splitIntoBundles(trees, size)
      expect(bundles.reduce((s, n) => s + n, 0)).toBe(trees)
      expect(bundles.every(n => n >= 1 && n <= size)).toBe(true)
      expect(bundles.length).toBe(Math.ceil(trees / size))
    }
  })

  it('refuses a bundle of no trees or a part of a tree', () => {
    expect(() => splitIntoBundles(10, 0)).toThrow(RangeError)
    expect(() => splitIntoBundles(10, 2.5)).toThrow(RangeError)
    expect(() => splitIntoBundles(-1, 10)).toThrow(RangeError)
  })
})

describe('label words', () => {
  it('says a grade by its caliper, height and whether the trees are feathered', () => {
    // A whip is a tree without side shoots; a feathered tree has them (common practice).
    expect(gradeInWords({ caliperMm: 16, heightCm: 150, feathered: true })).toBe('16 mm caliper, 150 cm, feathered')
    expect(gradeInWords({ caliperMm: 11.5, heightCm: null, feathered: false })).toBe('11.5 mm caliper, whip')
  })

  it('says the delivery as season and year', () => {
    expect(deliveryInWords(2027, 'spring')).toBe('spring 2027')
  })
})
