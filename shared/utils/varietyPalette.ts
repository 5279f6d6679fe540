// The row map's colours: each variety keeps one colour wherever it appears (map, legend, plan), by
// its id, so a run of Dabinett is the same colour on every screen and every printed plan. Each
// colour carries the label colour that reads on it; the unit test checks every pair against the
// WCAG 2.1 contrast ratio of 4.5:1 for text.

export interface Swatch {
  /** Our own name for the colour, for the legend's text alternative. */
  name: string
  fill: string
  /** Label colour on the fill: near-black or white, whichever reads. */
  ink: string
}

const DARK_INK = '#1b1a17'
const LIGHT_INK = '#ffffff'

/** Orchard, fruit and cellar colours, light and dark in turn so neighbouring ids differ in tone. */
export const VARIETY_SWATCHES: readonly Swatch[] = [
  { name: 'russet', fill: '#7a2e1f', ink: LIGHT_INK },
  { name: 'straw', fill: '#d8b43c', ink: DARK_INK },
  { name: 'hedge', fill: '#2f5a24', ink: LIGHT_INK },
  { name: 'blush', fill: '#e29a78', ink: DARK_INK },
  { name: 'slate', fill: '#2c5878', ink: LIGHT_INK },
  { name: 'green apple', fill: '#a9c96e', ink: DARK_INK },
  { name: 'damson', fill: '#5e3570', ink: LIGHT_INK },
  { name: 'peel', fill: '#efcfae', ink: DARK_INK },
  { name: 'pond', fill: '#1c635e', ink: LIGHT_INK },
  { name: 'quince', fill: '#f2d65e', ink: DARK_INK },
  { name: 'bark', fill: '#6e4622', ink: LIGHT_INK },
  { name: 'sky', fill: '#a6bfdc', ink: DARK_INK },
  { name: 'crab', fill: '#9a2f50', ink: LIGHT_INK },
  { name: 'pale leaf', fill: '#cadfa6', ink: DARK_INK },
  { name: 'cellar', fill: '#45433d', ink: LIGHT_INK },
  { name: 'perry', fill: '#c7c38a', ink: DARK_INK },
]

/** The colour of a variety: the same id always gives the same swatch. */
export function varietySwatch(varietyId: number): Swatch {
  if (!Number.isInteger(varietyId) || varietyId < 1) throw new RangeError(`A variety id is a whole number from 1; got ${varietyId}`)
  return VARIETY_SWATCHES[(varietyId - 1) % VARIETY_SWATCHES.length]!
}

function channel(hex: string, offset: number): number {
  const c = Number.parseInt(hex.slice(offset, offset + 2), 16) / 255
  return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
}

/** Relative luminance of a #rrggbb colour, as WCAG 2.1 defines it. https://www.w3.org/TR/WCAG21/#dfn-relative-luminance */
export function relativeLuminance(hex: string): number {
  if (!/^#[0-9a-f]{6}$/i.test(hex)) throw new RangeError(`Give a colour as #rrggbb; got ${hex}`)
  return 0.2126 * channel(hex, 1) + 0.7152 * channel(hex, 3) + 0.0722 * channel(hex, 5)
}

/** Contrast ratio of two colours, 1 to 21. https://www.w3.org/TR/WCAG21/#dfn-contrast-ratio */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [number, number]
  return (hi + 0.05) / (lo + 0.05)
}
