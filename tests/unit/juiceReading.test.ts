import { describe, it, expect } from 'vitest'
import { BRIX_SG_TOLERANCE_BRIX, READING_LIMITS, normaliseReading, readingClass, type RawReading } from '../../shared/utils/juiceReading'

const apple = { calibrationC: 20, species: 'apple' as const }

function ok(raw: RawReading, options = apple) {
  const result = normaliseReading(raw, options)
  if (!result.ok) throw new Error(`expected a reading, got ${JSON.stringify(result.issues)}`)
  return result.reading
}

function fieldsOf(raw: RawReading, options = apple): string[] {
  const result = normaliseReading(raw, options)
  if (result.ok) throw new Error('expected issues')
  return result.issues.map(i => i.field)
}

describe('normaliseReading: sugar', () => {
  it('keeps 10 °Brix beside SG 1.0400 at the calibration temperature (NBS Circular 440, Table 114: 10 °Bx → 1.04003)', () => {
    const r = ok({ brix: 10, sg: 1.04, tempC: 20 })
    expect(r.brix).toBe(10)
    expect(r.sg).toBeCloseTo(1.04, 6)
    expect(r.sgAsRead).toBe(1.04)
    expect(r.tempC).toBe(20)
  })

  it('corrects SG 1.0400 read at 25 °C to about 1.0412 on a 20 °C hydrometer, keeping the reading as read (Lyons, HBD #963: + 0.99823 − 0.99707)', () => {
    const r = ok({ sg: 1.04, tempC: 25 })
    expect(r.sg).toBeCloseTo(1.04116, 5)
    expect(r.sgAsRead).toBe(1.04)
  })

  it('uses the organisation\'s calibration temperature: at 15 °C the same reading becomes 1.0421 (Lyons, HBD #963: + 0.99913 − 0.99707)', () => {
    expect(ok({ sg: 1.04, tempC: 25 }, { calibrationC: 15, species: 'apple' }).sg).toBeCloseTo(1.04206, 5)
  })

  it('stores SG as given when no temperature is given', () => {
    const r = ok({ sg: 1.05 })
    expect(r.sg).toBe(1.05)
    expect(r.tempC).toBeNull()
  })

  it('refuses °Brix and SG that disagree by more than the tolerance, saying what each gives (NBS cubic: SG 1.0600 ≈ 14.7 °Bx)', () => {
    const result = normaliseReading({ brix: 10, sg: 1.06 }, apple)
    expect(result.ok).toBe(false)
    if (result.ok) return
    expect(result.issues[0]!.field).toBe('sg')
    expect(result.issues[0]!.message).toContain('10.0')
    expect(result.issues[0]!.message).toContain('14.7')
    expect(BRIX_SG_TOLERANCE_BRIX).toBe(0.5)
  })

  it('accepts °Brix and SG 0.4 °Brix apart (inside the 0.5 °Brix tolerance; NBS Circular 440, Table 114: 10 °Bx → 1.04003)', () => {
    expect(ok({ brix: 10.4, sg: 1.04 }).brix).toBe(10.4)
  })
})

describe('normaliseReading: acid, tannin, YAN', () => {
  it('stores 7.5 g/L as tartaric as 6.70 g/L as malic (AWRI, "Interconversion of acidity units": × 67.04 / 75.04)', () => {
    const r = ok({ ta: 7.5, taAs: 'tartaric' })
    expect(r.taGPerL).toBeCloseTo(6.7004, 4)
    expect(r.taReportedAs).toBe('tartaric')
    expect(r.taReportedValue).toBe(7.5)
    expect(r.taReportedUnit).toBe('g/L')
  })

  it('stores 0.45 % w/v as sulfuric as 6.15 g/L as malic (% w/v × 10 = g/L; AWRI: × 67.04 / 49.04)', () => {
    expect(ok({ ta: 0.45, taAs: 'sulfuric', taUnit: '% w/v' }).taGPerL).toBeCloseTo(6.1517, 4)
  })

  it('takes TA as malic in g/L when no basis is given (common practice for cider)', () => {
    const r = ok({ ta: 5.2 })
    expect(r.taGPerL).toBe(5.2)
    expect(r.taReportedAs).toBe('malic')
  })

  it('turns tannin in % and mg/L into g/L (0.25 % = 2500 mg/L = 2.5 g/L; common practice)', () => {
    expect(ok({ tannin: 0.25, tanninUnit: '%' }).tanninGPerL).toBeCloseTo(2.5, 10)
    expect(ok({ tannin: 2500, tanninUnit: 'mg/L' }).tanninGPerL).toBeCloseTo(2.5, 10)
    expect(ok({ tannin: 1.8 }).tanninGPerL).toBe(1.8)
  })

  it('keeps pH and YAN as given', () => {
    const r = ok({ ph: 3.6, yan: 120 })
    expect(r.ph).toBe(3.6)
    expect(r.yanMgPerL).toBe(120)
    expect(r.brix).toBeNull()
  })
})

describe('normaliseReading: impossible values', () => {
  it('exports the limits it refuses by', () => {
    expect(READING_LIMITS.brix).toEqual({ min: 0, max: 32 })
    expect(READING_LIMITS.sg).toEqual({ min: 1.0, max: 1.14 })
    expect(READING_LIMITS.ph).toEqual({ min: 2.5, max: 5.0 })
  })

  it('refuses °Brix above 32, SG outside 1.000–1.140 and pH outside 2.5–5.0, naming each field', () => {
    expect(fieldsOf({ brix: 33 })).toEqual(['brix'])
    expect(fieldsOf({ sg: 0.99 })).toEqual(['sg'])
    expect(fieldsOf({ sg: 1.2 })).toEqual(['sg'])
    expect(fieldsOf({ ph: 2.4 })).toEqual(['ph'])
    expect(fieldsOf({ ph: 5.1 })).toEqual(['ph'])
  })

  it('refuses negative numbers', () => {
    expect(fieldsOf({ brix: -1 })).toEqual(['brix'])
    expect(fieldsOf({ ta: -2 })).toEqual(['ta'])
    expect(fieldsOf({ tannin: -0.1 })).toEqual(['tannin'])
    expect(fieldsOf({ yan: -5 })).toEqual(['yan'])
    expect(fieldsOf({ sg: 1.05, tempC: -3 })).toEqual(['tempC'])
  })

  it('refuses a reading with nothing measured (a temperature alone measures nothing)', () => {
    expect(normaliseReading({}, apple).ok).toBe(false)
    expect(normaliseReading({ tempC: 18 }, apple).ok).toBe(false)
  })

  it('names every field at fault at once', () => {
    expect(fieldsOf({ brix: 40, ph: 7, yan: -1 })).toEqual(['brix', 'ph', 'yan'])
  })
})

describe('readingClass', () => {
  it('is bittersharp for an apple juice of 6.0 g/L acid and 2.5 g/L tannin (Long Ashton: above 4.5 g/L and 2.0 g/L)', () => {
    expect(readingClass({ taGPerL: 6, tanninGPerL: 2.5 }, 'apple')).toBe('bittersharp')
  })

  it('reads a pear juice by the perry pear classes: 3.0 g/L acid, 1.0 g/L tannin is medium sharp, an apple of it sweet (Pollard & Beech; Long Ashton)', () => {
    expect(readingClass({ taGPerL: 3, tanninGPerL: 1 }, 'pear')).toBe('medium sharp')
    expect(readingClass({ taGPerL: 3, tanninGPerL: 1 }, 'apple')).toBe('sweet')
  })

  it('is null without both acid and tannin', () => {
    expect(readingClass({ taGPerL: 6, tanninGPerL: null }, 'apple')).toBeNull()
  })
})
