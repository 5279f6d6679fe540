import { describe, expect, it } from 'vitest'
import { contrastRatio, relativeLuminance, VARIETY_SWATCHES, varietySwatch } from '../../shared/utils/varietyPalette'

describe('contrastRatio', () => {
  it('runs from 1:1 for a colour on itself to 21:1 for black on white (WCAG 2.1, definition of contrast ratio)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 10)
    expect(contrastRatio('#ffffff', '#000000')).toBeCloseTo(21, 10)
    expect(contrastRatio('#77746a', '#77746a')).toBe(1)
  })

  it('gives white a relative luminance of 1 and black 0 (WCAG 2.1, definition of relative luminance)', () => {
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 10)
    expect(relativeLuminance('#000000')).toBe(0)
  })

  it('puts mid-grey #777777 just under 4.5:1 on white and #767676 just over (common practice: the lightest grey for body text)', () => {
    expect(contrastRatio('#777777', '#ffffff')).toBeLessThan(4.5)
    expect(contrastRatio('#767676', '#ffffff')).toBeGreaterThan(4.5)
  })

  it('refuses a colour not written as #rrggbb', () => {
    expect(() => relativeLuminance('red')).toThrow(RangeError)
  })
})

describe('varietySwatch', () => {
  it('gives every label at least 4.5:1 on its fill (WCAG 2.1, success criterion 1.4.3)', () => {
    for (const swatch of VARIETY_SWATCHES) {
      expect(contrastRatio(swatch.fill, swatch.ink), swatch.name).toBeGreaterThanOrEqual(4.5)
    }
  })

  it('keeps one colour per variety id, and gives neighbouring ids different colours', () => {
    expect(varietySwatch(7)).toEqual(varietySwatch(7))
    expect(varietySwatch(7 + VARIETY_SWATCHES.length)).toEqual(varietySwatch(7))
    for (let id = 1; id < VARIETY_SWATCHES.length; id++) expect(varietySwatch(id).fill).not.toBe(varietySwatch(id + 1).fill)
  })

  it('has no two swatches alike', () => {
    expect(new Set(VARIETY_SWATCHES.map(s => s.fill)).size).toBe(VARIETY_SWATCHES.length)
    expect(new Set(VARIETY_SWATCHES.map(s => s.name)).size).toBe(VARIETY_SWATCHES.length)
  })

  it('refuses an id that is no id', () => {
    expect(() => varietySwatch(0)).toThrow(RangeError)
    expect(() => varietySwatch(1.5)).toThrow(RangeError)
  })
})
