import { describe, expect, it } from 'vitest'
import { contractYearSummary, excessOfLoad, shortfallMeaning, toleranceBandKg } from '#shared/utils/deliveryYear'

// Every figure here is worked by hand from the contract year written beside it.

describe('toleranceBandKg', () => {
  it('puts the band at the contracted tonnes less and plus the tolerance', () => {
    // 40 t ± 10 % = 40,000 kg ± 4,000 kg.
    expect(toleranceBandKg(40, 10)).toEqual({ lowestKg: 36_000, highestKg: 44_000 })
    // 12.5 t ± 7.5 % = 12,500 kg ± 937.5 kg.
    expect(toleranceBandKg(12.5, 7.5)).toEqual({ lowestKg: 11_562.5, highestKg: 13_437.5 })
    // No tolerance: the band is the contracted tonnes alone.
    expect(toleranceBandKg(8, 0)).toEqual({ lowestKg: 8_000, highestKg: 8_000 })
  })
})

describe('contractYearSummary', () => {
  const year = { fruitContractId: 7, harvestYear: 2026, contractedTonnes: 40, tolerancePct: 10, cropFailure: 'forgiven' as const }

  it('finds the shortfall under the band and says what the crop-failure term does with it', () => {
    // 30,000 kg delivered against a band of 36–44 t: 36,000 − 30,000 = 6,000 kg short.
    expect(contractYearSummary({ ...year, deliveredKg: 30_000 })).toEqual({
      fruitContractId: 7, harvestYear: 2026, contractedTonnes: 40, tolerancePct: 10, lowestTonnes: 36, highestTonnes: 44,
      deliveredTonnes: 30, shortfallTonnes: 6, excessTonnes: 0, cropFailure: 'forgiven',
      shortfallMeans: 'If the crop failed, the shortfall of 6 t is forgiven: nothing is owed either way.',
    })
  })

  it('finds the excess over the band, to the kilogram', () => {
    // 45,250.4 kg against a top of 44,000 kg: 1,250.4 kg over, 1.25 t to the kilogram.
    const summary = contractYearSummary({ ...year, deliveredKg: 45_250.4 })
    expect(summary).toMatchObject({ deliveredTonnes: 45.25, shortfallTonnes: 0, excessTonnes: 1.25, shortfallMeans: null })
  })

  it('has neither inside the band, its edges included', () => {
    for (const deliveredKg of [36_000, 40_000, 44_000]) {
      expect(contractYearSummary({ ...year, deliveredKg })).toMatchObject({ shortfallTonnes: 0, excessTonnes: 0, shortfallMeans: null })
    }
  })

  it('adds tickets to 0.1 kg exactly: 0.1 + 0.2 kg is 0.3 kg', () => {
    const tiny = { ...year, contractedTonnes: 0.001, tolerancePct: 0 }
    // A band of exactly 1 kg; 0.1 + 0.2 kg delivered is 0.7 kg short, which is 0.001 t to the kilogram.
    expect(contractYearSummary({ ...tiny, deliveredKg: 0.1 + 0.2 })).toMatchObject({ shortfallTonnes: 0.001, excessTonnes: 0 })
  })
})

describe('shortfallMeaning', () => {
  it('words each crop-failure term, and nothing without a shortfall', () => {
    expect(shortfallMeaning('forgiven', 1.5, 2026)).toBe('If the crop failed, the shortfall of 1.5 t is forgiven: nothing is owed either way.')
    expect(shortfallMeaning('carried', 2.25, 2026)).toBe('If the crop failed, the shortfall of 2.25 t is carried to the 2027 harvest, on top of that year\'s tonnes.')
    expect(shortfallMeaning('owed', 1_234.5, 2028)).toBe('The shortfall of 1,234.5 t is owed by the grower, crop failure or not, as the contract\'s terms set out.')
    expect(shortfallMeaning('owed', 0, 2028)).toBeNull()
  })
})

describe('excessOfLoad', () => {
  // A band whose top is 44,000 kg (40 t + 10 %).
  const top = 44_000

  it('is the part of a load above the top, given what came before it', () => {
    // 40,000 kg before, a 6,000 kg load: 46,000 − 44,000 = 2,000 kg of it is past the top.
    expect(excessOfLoad(top, 40_000, 6_000)).toBe(2_000)
    // Already past the top before it: the whole 500 kg load.
    expect(excessOfLoad(top, 45_000, 500)).toBe(500)
    // Under the top with it: none.
    expect(excessOfLoad(top, 30_000, 5_000)).toBe(0)
    // Reaching the top exactly: none.
    expect(excessOfLoad(top, 38_000, 6_000)).toBe(0)
  })

  it('works to 0.1 kg, without a float\'s crumbs', () => {
    // 43,999.9 + 0.2 − 44,000 = 0.1 kg.
    expect(excessOfLoad(top, 43_999.9, 0.2)).toBe(0.1)
  })
})
