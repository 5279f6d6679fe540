// Potential and actual alcohol (% ABV) from gravity readings or from sugar.
// Gravities are apparent SG 20/20 °C as a hydrometer reads them (see sugar.ts).
// Perry pear juice carries sorbitol that yeast does not ferment, so every
// method here overstates a perry's alcohol; the page says so beside pear juice.

import { sgToPlato, sugarGPerL } from './sugar'

export const ALCOHOL_METHODS = ['gravity-drop', 'hall', 'balling'] as const
export type AlcoholMethod = (typeof ALCOHOL_METHODS)[number]
export const DEFAULT_ALCOHOL_METHOD: AlcoholMethod = 'gravity-drop'

export interface AlcoholMethodInfo {
  label: string
  description: string
  source: string
}

/** What the calculators page shows beside each method. */
export const ALCOHOL_METHOD_INFO: Record<AlcoholMethod, AlcoholMethodInfo> = {
  'gravity-drop': {
    label: 'Gravity drop',
    description: 'ABV = (OG − FG) × 131.25. Quick and close for ordinary ciders; reads low for strong ones.',
    source: 'Homebrewing texts after Papazian',
  },
  'hall': {
    label: 'Hall',
    description: 'ABW = 76.08 (OG − FG) / (1.775 − OG); ABV = ABW × FG / 0.794. Allows for the lighter alcohol and the higher starting sugar.',
    source: 'M. L. Hall, "Brew by the Numbers", Zymurgy 18(2), 1995',
  },
  'balling': {
    label: 'Balling',
    description: 'Real extract RE = 0.1808 OE + 0.8192 AE (°Plato); ABW = (OE − RE) / (2.0665 − 0.010665 OE); ABV = ABW × FG / 0.794.',
    source: 'C. J. N. Balling (Prague, 1843–1865), as set out by Nielsen et al., "Balling\'s formula – scrutiny of a brewing dogma", and Hall, Zymurgy 1995',
  },
}

/** Grams of sugar per litre that make 1 % vol alcohol (OIV; EU wine rules). The old convention was 17.5. */
export const SUGAR_G_PER_L_PER_ABV = 16.83

/** Density of ethanol relative to water used to turn ABW into ABV (Hall, Zymurgy 1995). */
const ETHANOL_SG = 0.794

function requireGravities(og: number, fg: number): void {
  if (!Number.isFinite(og) || og < 1 || og > 1.2) {
    throw new RangeError(`Original gravity must be from 1.000 to 1.200; got ${og}`)
  }
  if (!Number.isFinite(fg) || fg < 0.98 || fg > 1.2) {
    throw new RangeError(`Final gravity must be from 0.980 to 1.200; got ${fg}`)
  }
  if (fg > og) {
    throw new RangeError(`Final gravity ${fg} is above original gravity ${og}: fermentation cannot add sugar`)
  }
}

/**
 * Balling's formula. Real extract from original and apparent extract (°Plato):
 * RE = 0.1808 OE + 0.8192 AE; alcohol by weight
 * ABW = (OE − RE) / (2.0665 − 0.010665 OE), from Balling's mass balance
 * 2.0665 g extract → 1 g ethanol + 0.9565 g CO2 + 0.11 g yeast.
 * Source: Nielsen, Kristiansen, Lassen and Erikstrøm, "Balling's formula –
 * scrutiny of a brewing dogma" (Scandinavian School of Brewing); RE coefficients
 * as given by Hall, Zymurgy 18(2), 1995.
 */
export function ballingAbw(originalExtractP: number, apparentExtractP: number): number {
  if (!Number.isFinite(originalExtractP) || originalExtractP < 0 || originalExtractP > 45) {
    throw new RangeError(`Original extract must be from 0 to 45 °P; got ${originalExtractP}`)
  }
  if (!Number.isFinite(apparentExtractP) || apparentExtractP > originalExtractP) {
    throw new RangeError(`Apparent extract ${apparentExtractP} °P must be a number no higher than the original extract ${originalExtractP} °P`)
  }
  const realExtractP = 0.1808 * originalExtractP + 0.8192 * apparentExtractP
  return (originalExtractP - realExtractP) / (2.0665 - 0.010665 * originalExtractP)
}

/** Alcohol by volume (%) from original and final gravity by the chosen method. */
export function abvFromGravity(og: number, fg: number, method: AlcoholMethod = DEFAULT_ALCOHOL_METHOD): number {
  requireGravities(og, fg)
  switch (method) {
    case 'gravity-drop':
      // (OG − FG) × 131.25: homebrewing texts after Papazian.
      return (og - fg) * 131.25
    case 'hall': {
      // Hall, Zymurgy 18(2), 1995: ABW = 76.08 (OG − FG) / (1.775 − OG); ABV = ABW × FG / 0.794.
      const abw = (76.08 * (og - fg)) / (1.775 - og)
      return (abw * fg) / ETHANOL_SG
    }
    case 'balling':
      // Balling's formula on the extracts read through the ASBC polynomial; ABV as Hall.
      return (ballingAbw(sgToPlato(og), sgToPlato(fg)) * fg) / ETHANOL_SG
    default: {
      const unknown: never = method
      throw new RangeError(`Unknown alcohol method: ${String(unknown)}`)
    }
  }
}

/** Potential alcohol (% vol) of a juice holding this much fermentable sugar: g/L ÷ 16.83 (OIV; EU wine rules). */
export function abvFromSugarGPerL(sugarGPerLitre: number): number {
  if (!Number.isFinite(sugarGPerLitre) || sugarGPerLitre < 0) {
    throw new RangeError(`Sugar must be zero or more g/L; got ${sugarGPerLitre}`)
  }
  return sugarGPerLitre / SUGAR_G_PER_L_PER_ABV
}

/**
 * Potential alcohol (% vol) of a juice from its °Brix: its sugar from the OIV refractometry table
 * (sugar.ts), ÷ 16.83 g/L per % vol. Counting every soluble solid as sugar instead would read
 * 1–1.5 % vol high at cider gravities.
 */
export function potentialAbvFromBrix(brix: number): number {
  return abvFromSugarGPerL(sugarGPerL(brix))
}

/** How a juice's potential alcohol is worked: a gravity method taken to a dry finish at SG 1.000, or its sugar ÷ 16.83 g/L. */
export type PotentialAlcoholMethod = AlcoholMethod | 'sugar'

/**
 * Potential alcohol (% vol) of a juice of this °Brix and apparent SG 20/20 °C by the chosen method:
 * the drop from its gravity to 1.000 by a gravity method, or its sugar (OIV refractometry table)
 * ÷ 16.83 g/L (OIV).
 */
export function potentialAbv(juice: { brix: number, sg: number }, method: PotentialAlcoholMethod = DEFAULT_ALCOHOL_METHOD): number {
  return method === 'sugar' ? potentialAbvFromBrix(juice.brix) : abvFromGravity(juice.sg, 1, method)
}
