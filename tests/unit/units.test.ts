import { describe, it, expect } from 'vitest'
import {
  HA_PER_ACRE,
  KG_PER_LB,
  KG_PER_SHORT_TON,
  L_PER_US_GAL,
  M2_PER_ACRE,
  M_PER_FT,
  QUANTITY_KINDS,
  acresToHa,
  ftToM,
  haToAcres,
  kgToLb,
  lbToKg,
  litresToUsGal,
  mToFt,
  shortTonsPerAcreToTPerHa,
  shortTonsToTonnes,
  showArea,
  showLength,
  showMass,
  showQuantity,
  showTonnage,
  tPerHaToShortTonsPerAcre,
  toSiArea,
  toSiLength,
  toSiMass,
  toSiQuantity,
  tonnesToShortTons,
  usGalToLitres,
} from '../../shared/utils/units'
import type { UnitSystem } from '../../shared/types/auth'

describe('defining constants (NIST SP 811, Appendix B; NIST Handbook 44, Appendix C)', () => {
  it('are exact', () => {
    expect(KG_PER_LB).toBe(0.45359237)
    expect(M_PER_FT).toBe(0.3048)
    expect(L_PER_US_GAL).toBe(3.785411784)
    expect(KG_PER_SHORT_TON).toBeCloseTo(907.18474, 10) // 2000 lb
    expect(M2_PER_ACRE).toBeCloseTo(4046.8564224, 9) // 43,560 ft²
    expect(HA_PER_ACRE).toBeCloseTo(0.40468564224, 12)
  })

  it('agree with the US gallon defined as 231 cubic inches of 2.54 cm (NIST Handbook 44)', () => {
    expect(231 * 2.54 ** 3 / 1000).toBeCloseTo(L_PER_US_GAL, 12)
  })
})

describe('conversions', () => {
  it('mass: 1 lb = 0.45359237 kg; 1000 kg = 2204.62 lb (NIST SP 811)', () => {
    expect(lbToKg(1)).toBe(0.45359237)
    expect(kgToLb(1000)).toBeCloseTo(2204.6226, 4)
    expect(kgToLb(lbToKg(123.4))).toBeCloseTo(123.4, 12)
  })

  it('tonnage: 1 short ton = 0.90718474 t; 1 t = 1.1023 short tons (NIST SP 811)', () => {
    expect(shortTonsToTonnes(1)).toBeCloseTo(0.90718474, 12)
    expect(tonnesToShortTons(1)).toBeCloseTo(1.1023113, 7)
  })

  it('volume: 1 US gal = 3.785411784 L; 1000 L = 264.17 US gal (NIST Handbook 44)', () => {
    expect(usGalToLitres(1)).toBe(3.785411784)
    expect(litresToUsGal(1000)).toBeCloseTo(264.172, 3)
  })

  it('area: 1 acre = 0.40468564224 ha; 1 ha = 2.4711 acres (NIST SP 811)', () => {
    expect(acresToHa(1)).toBeCloseTo(0.40468564224, 12)
    expect(haToAcres(1)).toBeCloseTo(2.4710538, 6)
  })

  it('length: 1 ft = 0.3048 m; 3.5 m = 11.48 ft (NIST SP 811)', () => {
    expect(ftToM(1)).toBe(0.3048)
    expect(mToFt(3.5)).toBeCloseTo(11.48294, 5)
  })

  it('yield: 1 short ton/acre = 2.2417 t/ha and 1 t/ha = 0.4461 short ton/acre (derived from the exact constants)', () => {
    // Worked example: 0.90718474 t / 0.40468564224 ha = 2.2417023 t/ha.
    expect(shortTonsPerAcreToTPerHa(1)).toBeCloseTo(2.2417023, 7)
    expect(tPerHaToShortTonsPerAcre(1)).toBeCloseTo(0.4460896, 7)
    expect(tPerHaToShortTonsPerAcre(shortTonsPerAcreToTPerHa(12.5))).toBeCloseTo(12.5, 12)
  })

  it('refuses values that are not finite numbers', () => {
    expect(() => kgToLb(Number.NaN)).toThrow(/Mass must be a finite number/)
    expect(() => usGalToLitres(Number.POSITIVE_INFINITY)).toThrow(RangeError)
    expect(() => haToAcres(Number.NaN)).toThrow(RangeError)
  })
})

describe('display helpers', () => {
  it('show SI unchanged for metric users', () => {
    expect(showMass(850, 'metric')).toEqual({ value: 850, unit: 'kg' })
    expect(showTonnage(12, 'metric')).toEqual({ value: 12, unit: 't' })
    expect(showQuantity('volume', 650, 'metric')).toEqual({ value: 650, unit: 'L' })
    expect(showArea(2.5, 'metric')).toEqual({ value: 2.5, unit: 'ha' })
    expect(showLength(3.5, 'metric')).toEqual({ value: 3.5, unit: 'm' })
    expect(showQuantity('yieldPerArea', 40, 'metric')).toEqual({ value: 40, unit: 't/ha' })
  })

  it('show US customary units for US users', () => {
    expect(showMass(0.45359237, 'us')).toEqual({ value: 1, unit: 'lb' })
    const tons = showTonnage(0.90718474, 'us')
    expect(tons.unit).toBe('short ton')
    expect(tons.value).toBeCloseTo(1, 12)
    expect(showQuantity('volume', 3.785411784, 'us')).toEqual({ value: 1, unit: 'US gal' })
    const area = showArea(0.40468564224, 'us')
    expect(area.unit).toBe('acre')
    expect(area.value).toBeCloseTo(1, 12)
    expect(showLength(0.3048, 'us')).toEqual({ value: 1, unit: 'ft' })
    const yieldShown = showQuantity('yieldPerArea', 40, 'us')
    expect(yieldShown.unit).toBe('short ton/acre')
    expect(yieldShown.value).toBeCloseTo(17.84358, 5)
  })

  it('take form input back to SI, inverse of what they show', () => {
    const systems: UnitSystem[] = ['metric', 'us']
    for (const system of systems) {
      expect(toSiMass(showMass(1234.5, system).value, system)).toBeCloseTo(1234.5, 9)
      expect(toSiQuantity('tonnage', showTonnage(18.2, system).value, system)).toBeCloseTo(18.2, 12)
      expect(toSiQuantity('volume', showQuantity('volume', 950, system).value, system)).toBeCloseTo(950, 9)
      expect(toSiArea(showArea(3.2, system).value, system)).toBeCloseTo(3.2, 12)
      expect(toSiLength(showLength(1.2, system).value, system)).toBeCloseTo(1.2, 12)
      expect(toSiQuantity('yieldPerArea', showQuantity('yieldPerArea', 35, system).value, system)).toBeCloseTo(35, 12)
    }
    expect(toSiMass(1, 'us')).toBe(0.45359237)
  })

  it('round-trip every kind in the table, keep SI for metric and name a different unit for US', () => {
    expect(QUANTITY_KINDS).toEqual(['mass', 'tonnage', 'volume', 'area', 'length', 'yieldPerArea'])
    for (const kind of QUANTITY_KINDS) {
      for (const si of [0, 1, 7.25, 1234.5]) {
        expect(showQuantity(kind, si, 'metric').value).toBe(si)
        expect(toSiQuantity(kind, showQuantity(kind, si, 'us').value, 'us')).toBeCloseTo(si, 9)
      }
      expect(showQuantity(kind, 1, 'us').unit).not.toBe(showQuantity(kind, 1, 'metric').unit)
    }
  })

  it('refuses an unknown unit system', () => {
    // @ts-expect-error: only 'metric' and 'us' exist
    expect(() => showMass(1, 'imperial')).toThrow(/Unit system must be 'metric' or 'us'/)
    // @ts-expect-error: only 'metric' and 'us' exist
    expect(() => toSiQuantity('volume', 1, 'imperial')).toThrow(RangeError)
  })
})
