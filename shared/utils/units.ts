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

function requireFinite(value: number, what: string): void {
  if (!Number.isFinite(value)) throw new RangeError(`${what} must be a finite number; got ${value}`)
}

function requireSystem(system: UnitSystem): void {
  if (!UNIT_SYSTEMS.includes(system)) {
    throw new RangeError(`Unit system must be 'metric' or 'us'; got ${String(system)}`)
  }
}

// Plain conversions. Each is one of the exact constants above.
export function kgToLb(kg: number): number { requireFinite(kg, 'Mass'); return kg / KG_PER_LB }
export function lbToKg(lb: number): number { requireFinite(lb, 'Mass'); return lb * KG_PER_LB }
export function tonnesToShortTons(t: number): number { requireFinite(t, 'Mass'); return (t * 1000) / KG_PER_SHORT_TON }
export function shortTonsToTonnes(tons: number): number { requireFinite(tons, 'Mass'); return (tons * KG_PER_SHORT_TON) / 1000 }
export function litresToUsGal(l: number): number { requireFinite(l, 'Volume'); return l / L_PER_US_GAL }
export function usGalToLitres(gal: number): number { requireFinite(gal, 'Volume'); return gal * L_PER_US_GAL }
export function haToAcres(ha: number): number { requireFinite(ha, 'Area'); return ha / HA_PER_ACRE }
export function acresToHa(acres: number): number { requireFinite(acres, 'Area'); return acres * HA_PER_ACRE }
export function mToFt(m: number): number { requireFinite(m, 'Length'); return m / M_PER_FT }
export function ftToM(ft: number): number { requireFinite(ft, 'Length'); return ft * M_PER_FT }

/** t/ha → short tons per acre: tonnes → short tons, per ha → per acre (× acres per ha⁻¹). */
export function tPerHaToShortTonsPerAcre(tPerHa: number): number {
  return tonnesToShortTons(tPerHa) * HA_PER_ACRE
}
/** Short tons per acre → t/ha, the inverse of tPerHaToShortTonsPerAcre. */
export function shortTonsPerAcreToTPerHa(tonsPerAcre: number): number {
  return shortTonsToTonnes(tonsPerAcre) / HA_PER_ACRE
}

// Display: an SI value in, the number and unit to show for the user's system out.
export type MassUnit = 'kg' | 'lb'
export type TonnageUnit = 't' | 'short ton'
export type VolumeUnit = 'L' | 'US gal'
export type AreaUnit = 'ha' | 'acre'
export type LengthUnit = 'm' | 'ft'
export type YieldPerAreaUnit = 't/ha' | 'short ton/acre'

export function showMass(kg: number, system: UnitSystem): Quantity<MassUnit> {
  requireSystem(system)
  return system === 'us' ? { value: kgToLb(kg), unit: 'lb' } : { value: kg, unit: 'kg' }
}
export function showTonnage(tonnes: number, system: UnitSystem): Quantity<TonnageUnit> {
  requireSystem(system)
  return system === 'us' ? { value: tonnesToShortTons(tonnes), unit: 'short ton' } : { value: tonnes, unit: 't' }
}
export function showVolume(l: number, system: UnitSystem): Quantity<VolumeUnit> {
  requireSystem(system)
  return system === 'us' ? { value: litresToUsGal(l), unit: 'US gal' } : { value: l, unit: 'L' }
}
export function showArea(ha: number, system: UnitSystem): Quantity<AreaUnit> {
  requireSystem(system)
  return system === 'us' ? { value: haToAcres(ha), unit: 'acre' } : { value: ha, unit: 'ha' }
}
export function showLength(m: number, system: UnitSystem): Quantity<LengthUnit> {
  requireSystem(system)
  return system === 'us' ? { value: mToFt(m), unit: 'ft' } : { value: m, unit: 'm' }
}
export function showYieldPerArea(tPerHa: number, system: UnitSystem): Quantity<YieldPerAreaUnit> {
  requireSystem(system)
  return system === 'us'
    ? { value: tPerHaToShortTonsPerAcre(tPerHa), unit: 'short ton/acre' }
    : { value: tPerHa, unit: 't/ha' }
}

// Form input: a number typed in the user's system → the SI value to store.
export function toSiMass(value: number, system: UnitSystem): number {
  requireSystem(system)
  return system === 'us' ? lbToKg(value) : value
}
export function toSiTonnage(value: number, system: UnitSystem): number {
  requireSystem(system)
  return system === 'us' ? shortTonsToTonnes(value) : value
}
export function toSiVolume(value: number, system: UnitSystem): number {
  requireSystem(system)
  return system === 'us' ? usGalToLitres(value) : value
}
export function toSiArea(value: number, system: UnitSystem): number {
  requireSystem(system)
  return system === 'us' ? acresToHa(value) : value
}
export function toSiLength(value: number, system: UnitSystem): number {
  requireSystem(system)
  return system === 'us' ? ftToM(value) : value
}
export function toSiYieldPerArea(value: number, system: UnitSystem): number {
  requireSystem(system)
  return system === 'us' ? shortTonsPerAcreToTPerHa(value) : value
}
