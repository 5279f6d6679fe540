import type { BindingRange, BlendMiss, BlendProperty, BlendTargetRanges, Range } from '../types/blend'
import { PROPERTY_LIMITS } from '../schemas/blend'
import { ALCOHOL_METHOD_INFO, type AlcoholMethodInfo, type PotentialAlcoholMethod } from './alcohol'
import { juiceKgPerLitre } from './blendMix'
import { formatContractMoney } from './contractDisplay'
import { pearsonBrix, pearsonSquare } from './pearsonSquare'

// How a blend reads to the maker: each property's name and unit, a binding range's saving in a
// sentence, the range loosened by the step that sentence quotes, and a missed range in plain words.

export interface BlendPropertyInfo {
  label: string
  /** The unit shown after a value ('' for SG, which has none). */
  unit: string
  /** Decimals a value is shown with. */
  digits: number
  /** How far one "loosen" moves a bound: the resolution the maker reads it to. */
  step: number
  /** The unit the solver quotes a saving per (minor units per °Brix, per 0.001 SG, per g/L). */
  costUnit: number
}

export const BLEND_PROPERTY_INFO: Record<BlendProperty, BlendPropertyInfo> = {
  brix: { label: '°Brix', unit: '°Bx', digits: 1, step: 0.1, costUnit: 1 },
  sg: { label: 'SG', unit: '', digits: 3, step: 0.001, costUnit: 0.001 },
  taGPerL: { label: 'TA', unit: 'g/L', digits: 1, step: 0.1, costUnit: 1 },
  tanninGPerL: { label: 'tannin', unit: 'g/L', digits: 1, step: 0.1, costUnit: 1 },
}

/** A value of a property with its unit: 5.0 g/L, 1.052, 12.4 °Bx. */
export function formatBlendValue(property: BlendProperty, value: number, extraDigits = 0): string {
  const info = BLEND_PROPERTY_INFO[property]
  const text = value.toFixed(info.digits + extraDigits)
  return info.unit ? `${text} ${info.unit}` : text
}

/** The range's bound moved one step outward, kept to the step's decimals (4.9, never 4.8999…). */
export function loosenedBound(property: BlendProperty, bound: 'min' | 'max', value: number): number {
  const { step, digits } = BLEND_PROPERTY_INFO[property]
  const moved = bound === 'min' ? value - step : value + step
  return Number(moved.toFixed(digits + 1))
}

/** The ranges with one bound moved one step outward; the other ranges as they were. */
export function loosenRanges(ranges: BlendTargetRanges, property: BlendProperty, bound: 'min' | 'max'): BlendTargetRanges {
  const range = ranges[property]
  if (!range) throw new RangeError(`There is no ${BLEND_PROPERTY_INFO[property].label} range to loosen`)
  return { ...ranges, [property]: { ...range, [bound]: loosenedBound(property, bound, range[bound]) } }
}

/** What one step outward saves, in minor units: the solver's cost per unit scaled to the step. */
export function savingPerStep(binding: Pick<BindingRange, 'property' | 'costPerUnit'>): number {
  const { step, costUnit } = BLEND_PROPERTY_INFO[binding.property]
  return binding.costPerUnit * (step / costUnit)
}

function moneyText(minor: number, currency: string): string {
  return minor < 0.5 ? `less than ${formatContractMoney(1, currency)}` : `about ${formatContractMoney(Math.round(minor), currency)}`
}

/**
 * A binding range's saving as the maker reads it: "Allowing TA down to 4.9 g/L would save about
 * £12.34 per 0.1 g/L." The bound is the one the blend was solved against.
 */
export function savingSentence(binding: BindingRange, range: Range, currency: string): string {
  const info = BLEND_PROPERTY_INFO[binding.property]
  const to = loosenedBound(binding.property, binding.bound, range[binding.bound])
  const stepText = formatBlendValue(binding.property, info.step)
  const per = info.unit ? stepText : `${stepText} ${info.label}`
  return `Allowing ${info.label} ${binding.bound === 'min' ? 'down' : 'up'} to ${formatBlendValue(binding.property, to)} would save ${moneyText(savingPerStep(binding), currency)} per ${per}.`
}

/**
 * What loosening a range did, beside what it was said to do: "Allowing TA up to 6.6 g/L saved £0.33
 * (about £0.33 was said)." The saving said is the LP's rate at the blend before; a step past the
 * point where another lot or range takes over saves less, and this says so.
 */
export function looseningSentence(l: { property: BlendProperty, bound: 'min' | 'max', to: number, saidMinor: number, costBefore: number }, costAfter: number, currency: string): string {
  const info = BLEND_PROPERTY_INFO[l.property]
  const saved = l.costBefore - costAfter
  const head = `Allowing ${info.label} ${l.bound === 'min' ? 'down' : 'up'} to ${formatBlendValue(l.property, l.to)}`
  const said = moneyText(l.saidMinor, currency)
  if (saved <= 0) return `${head} saved nothing (${said} was said).`
  const less = saved < l.saidMinor * 0.9 - 1
  return `${head} saved ${formatContractMoney(Math.round(saved), currency)} (${said} was said${less ? ': past a point in that step, other lots or ranges took over, so it saved less' : ''}).`
}

/** A missed range in plain words: "TA is 4.62 g/L, 0.38 g/L under the 5.0–6.5 g/L asked for." */
export function missSentence(miss: BlendMiss, volumeText: (litres: number) => string): string {
  if (miss.property === 'volumeL') {
    const short = miss.min - miss.achieved
    return short > 0
      ? `The lots give ${volumeText(miss.achieved)} of juice, ${volumeText(short)} short of the ${volumeText(miss.min)} asked for.`
      : `The blend makes ${volumeText(miss.achieved)}, ${volumeText(miss.achieved - miss.max)} more than the ${volumeText(miss.max)} asked for.`
  }
  const { property } = miss
  const info = BLEND_PROPERTY_INFO[property]
  const under = miss.achieved < miss.min
  const by = under ? miss.min - miss.achieved : miss.achieved - miss.max
  const asked = `${miss.min.toFixed(info.digits)}–${formatBlendValue(property, miss.max)}`
  const name = info.label.charAt(0).toUpperCase() + info.label.slice(1)
  return `${name} is ${formatBlendValue(property, miss.achieved, 1)}, ${formatBlendValue(property, by, 1)} ${under ? 'under' : 'over'} the ${asked} asked for.`
}

/** A range typed with either side left empty, as the solver takes it: the open side stops at the widest range the API takes. */
export function rangeFromTyped(property: BlendProperty, min: number | null, max: number | null): Range | undefined {
  if (min === null && max === null) return undefined
  const open = PROPERTY_LIMITS[property]
  return { min: min ?? open.min, max: max ?? open.max }
}

/** The ways the blend's potential alcohol may be worked out, named as the page shows them. */
export const BLEND_ALCOHOL_METHODS: Record<PotentialAlcoholMethod, AlcoholMethodInfo> = {
  ...ALCOHOL_METHOD_INFO,
  sugar: {
    label: 'Sugar ÷ 16.83 g/L',
    description: 'The juice\'s sugar in g/L from its °Brix (the OIV refractometry table), over 16.83 g/L per % vol.',
    source: 'OIV; EU wine rules',
  },
}

/** Shares of the blend's volume summed by a key (the lot, its juice class), largest first. */
export function shareBy<T>(lines: readonly T[], key: (line: T) => string, share: (line: T) => number): { key: string, share: number }[] {
  const sums = new Map<string, number>()
  for (const line of lines) sums.set(key(line), (sums.get(key(line)) ?? 0) + share(line))
  return [...sums].map(([k, s]) => ({ key: k, share: s })).sort((a, b) => b.share - a.share)
}

export interface TwoLotJuice { brix: number, sg: number, taGPerL: number | null, litres: number }

export interface PearsonCheck {
  /** °Brix: A's share of the juice's mass, by the square and in the solver's blend. */
  brix: { square: number, solver: number } | null
  /** TA: A's share of the juice's volume, by the square and in the solver's blend. */
  ta: { square: number, solver: number } | null
}

/**
 * The Pearson square worked on a two-lot blend's own result: the square's split of the two juices
 * that gives the blend's °Brix (by mass) and TA (by volume), beside the split the solver chose. A
 * property on which the two lots are alike, or that one of them lacks, has no square.
 */
export function pearsonCheck(a: TwoLotJuice, b: TwoLotJuice, blend: { brix: number, taGPerL: number | null }): PearsonCheck {
  const massA = a.litres * juiceKgPerLitre(a.sg)
  const massB = b.litres * juiceKgPerLitre(b.sg)
  const attempt = <T>(work: () => T): T | null => {
    try {
      return work()
    }
    catch {
      return null
    }
  }
  return {
    brix: attempt(() => ({ square: pearsonBrix(a, b, blend.brix).massShareA, solver: massA / (massA + massB) })),
    ta: a.taGPerL === null || b.taGPerL === null || blend.taGPerL === null
      ? null
      : attempt(() => ({ square: pearsonSquare(a.taGPerL!, b.taGPerL!, blend.taGPerL!).shareA, solver: a.litres / (a.litres + b.litres) })),
  }
}
