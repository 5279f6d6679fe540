import { HA_PER_ACRE, showArea, showLength, showMass, showQuantity, showTonnage } from '#shared/utils/units'

/** Formats a number for display in British English with at most `digits` decimals. */
export function formatNumber(value: number, digits = 0): string {
  return new Intl.NumberFormat('en-GB', { maximumFractionDigits: digits }).format(value)
}

/** SI values shown in the signed-in person's units (metric or US customary), with their unit. */
export function useUnitDisplay() {
  const preferences = usePreferencesStore()
  const system = computed(() => preferences.units)
  return {
    system,
    areaUnit: computed(() => showArea(1, system.value).unit),
    lengthUnit: computed(() => showLength(1, system.value).unit),
    massUnit: computed(() => showMass(1, system.value).unit),
    tonnageUnit: computed(() => showTonnage(1, system.value).unit),
    volumeUnit: computed(() => showQuantity('volume', 1, system.value).unit),
    area: (ha: number, digits = 2) => `${formatNumber(showArea(ha, system.value).value, digits)} ${showArea(ha, system.value).unit}`,
    length: (m: number, digits = 1) => `${formatNumber(showLength(m, system.value).value, digits)} ${showLength(m, system.value).unit}`,
    mass: (kg: number, digits = 0) => `${formatNumber(showMass(kg, system.value).value, digits)} ${showMass(kg, system.value).unit}`,
    volume: (l: number, digits = 0) => `${formatNumber(showQuantity('volume', l, system.value).value, digits)} ${showQuantity('volume', l, system.value).unit}`,
    /** Trees per hectare → trees per ha or per acre (1 acre = 0.40468564224 ha, NIST). */
    density: (perHa: number) => system.value === 'us' ? `${formatNumber(perHa * HA_PER_ACRE)} trees/acre` : `${formatNumber(perHa)} trees/ha`,
  }
}
