// Metric ↔ US customary. Pomewright stores SI (kg, t, L, ha, m) and shows each
// user's preference. The defining constants are exact (NIST SP 811, Appendix B;
// NIST Handbook 44, Appendix C):
//   1 lb = 0.45359237 kg, 1 ft = 0.3048 m, 1 US gal = 231 in³ = 3.785411784 L,
//   1 short ton = 2000 lb, 1 acre = 43,560 ft² = 4046.8564224 m² (international
//   foot; NIST retired the US survey foot at the end of 2022).

import { UNIT_SYSTEMS, type UnitSystem } from '../types/auth'

export const KG_PER_LB = 0.45359237
export const KG_PER_SHORT_TON = 2000 * KG_PER_LB // 907.18474
export const L_PER_US_GAL = 3.785411784
export const M_PER_FT = 0.3048
export const FT2_PER_ACRE = 43_560
export const M2_PER_ACRE = FT2_PER_ACRE * M_PER_FT * M_PER_FT // 4046.8564224
export const M2_PER_HA = 10_000
export const HA_PER_ACRE = M2_PER_ACRE / M2_PER_HA // 0.40468564224

export interface Quantity<U extends string> {
  value: number
  unit: U
}

function finite(value: number, what: string): number {
  if (!Number.isFinite(value)) throw new RangeError(`${what} must be a finite number; got ${value}`)
  return value
}

function requireSystem(system: UnitSystem): void {
  if (!UNIT_SYSTEMS.includes(system)) {
    throw new RangeError(`Unit system must be 'metric' or 'us'; got ${String(system)}`)
  }
}

// Plain conversions. Each is one of the exact constants above.
export const kgToLb = (kg: number): number => finite(kg, 'Mass') / KG_PER_LB
export const lbToKg = (lb: number): number => finite(lb, 'Mass') * KG_PER_LB
export const tonnesToShortTons = (t: number): number => (finite(t, 'Mass') * 1000) / KG_PER_SHORT_TON
export const shortTonsToTonnes = (tons: number): number => (finite(tons, 'Mass') * KG_PER_SHORT_TON) / 1000
export const litresToUsGal = (l: number): number => finite(l, 'Volume') / L_PER_US_GAL
export const usGalToLitres = (gal: number): number => finite(gal, 'Volume') * L_PER_US_GAL
export const haToAcres = (ha: number): number => finite(ha, 'Area') / HA_PER_ACRE
export const acresToHa = (acres: number): number => finite(acres, 'Area') * HA_PER_ACRE
export const mToFt = (m: number): number => finite(m, 'Length') / M_PER_FT
export const ftToM = (ft: number): number => finite(ft, 'Length') * M_PER_FT

/** t/ha → short tons per acre: tonnes → short tons, per ha → per acre (× acres per ha⁻¹). */
export function tPerHaToShortTonsPerAcre(tPerHa: number): number {
  return tonnesToShortTons(tPerHa) * HA_PER_ACRE
}
/** Short tons per acre → t/ha, the inverse of tPerHaToShortTonsPerAcre. */
export function shortTonsPerAcreToTPerHa(tonsPerAcre: number): number {
  return shortTonsToTonnes(tonsPerAcre) / HA_PER_ACRE
}

// Each quantity a person sees: its SI unit (what we store), its US customary unit, and the
// conversions between them (the plain ones above). showQuantity and toSiQuantity read it; not
// `show`/`toSi`, as Nuxt imports shared/utils into every component, where `show` already names
// useUnitDisplay().
const QUANTITIES = {
  mass: { si: 'kg', us: 'lb', fromSi: kgToLb, toSi: lbToKg },
  tonnage: { si: 't', us: 'short ton', fromSi: tonnesToShortTons, toSi: shortTonsToTonnes },
  volume: { si: 'L', us: 'US gal', fromSi: litresToUsGal, toSi: usGalToLitres },
  area: { si: 'ha', us: 'acre', fromSi: haToAcres, toSi: acresToHa },
  length: { si: 'm', us: 'ft', fromSi: mToFt, toSi: ftToM },
  yieldPerArea: { si: 't/ha', us: 'short ton/acre', fromSi: tPerHaToShortTonsPerAcre, toSi: shortTonsPerAcreToTPerHa },
} as const satisfies Record<string, { si: string, us: string, fromSi: (si: number) => number, toSi: (us: number) => number }>

export type QuantityKind = keyof typeof QUANTITIES
export type UnitOf<K extends QuantityKind> = (typeof QUANTITIES)[K]['si' | 'us']
export const QUANTITY_KINDS = Object.keys(QUANTITIES) as QuantityKind[]

/** Display: an SI value in, the number and unit to show for the user's system out. */
export function showQuantity<K extends QuantityKind>(kind: K, value: number, system: UnitSystem): Quantity<UnitOf<K>> {
  requireSystem(system)
  const q = QUANTITIES[kind]
  // TypeScript widens QUANTITIES[kind] to every kind's entry; the units are this kind's.
  return (system === 'us' ? { value: q.fromSi(value), unit: q.us } : { value, unit: q.si }) as Quantity<UnitOf<K>>
}

/** Form input: a number typed in the user's system → the SI value to store. */
export function toSiQuantity(kind: QuantityKind, value: number, system: UnitSystem): number {
  requireSystem(system)
  return system === 'us' ? QUANTITIES[kind].toSi(value) : value
}

// The names the forms and the unit display call.
export const showMass = (kg: number, system: UnitSystem) => showQuantity('mass', kg, system)
export const showTonnage = (tonnes: number, system: UnitSystem) => showQuantity('tonnage', tonnes, system)
export const showArea = (ha: number, system: UnitSystem) => showQuantity('area', ha, system)
export const showLength = (m: number, system: UnitSystem) => showQuantity('length', m, system)
export const toSiMass = (value: number, system: UnitSystem) => toSiQuantity('mass', value, system)
export const toSiArea = (value: number, system: UnitSystem) => toSiQuantity('area', value, system)
export const toSiLength = (value: number, system: UnitSystem) => toSiQuantity('length', value, system)
