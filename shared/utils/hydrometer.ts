// Temperature correction of a hydrometer reading.
//
// A hydrometer reads true only at the temperature it was calibrated at: warmer juice is less dense
// and reads low, cooler juice reads high. The correction used in brewing and winemaking treats the
// juice as expanding like water: the reading gains the density of water at the calibration
// temperature less its density at the juice's temperature.
// Source: C. Lyons, "Hydrometer Temperature Corrections", Homebrew Digest #963 (7 September 1992),
// brewery.org library, which tabulates water's density (from the CRC Handbook of Chemistry and
// Physics) and the correction it gives relative to 15 °C; between its rows we interpolate in a
// straight line (at most about 0.03 thousandths of SG off over a 5 °C step).

/** Density of water, g/mL, by temperature in °C (Lyons, HBD #963, from the CRC Handbook), 0–100 °C. */
export const WATER_DENSITY_TABLE: readonly (readonly [tempC: number, gPerMl: number])[] = [
  [0, 0.99987], [3.98, 1.0], [5, 0.99999], [10, 0.99973], [15, 0.99913], [18, 0.99862], [20, 0.99823],
  [25, 0.99707], [30, 0.99567], [35, 0.99406], [38, 0.99299], [40, 0.99224], [45, 0.99025], [50, 0.98807],
  [55, 0.98573], [60, 0.98324], [65, 0.98059], [70, 0.97781], [75, 0.97489], [80, 0.97183], [85, 0.96865],
  [90, 0.96534], [95, 0.96192], [100, 0.95838],
]

export const HYDROMETER_TEMP_MIN_C = 0
export const HYDROMETER_TEMP_MAX_C = 100

/** Water's density at `tempC` from the table, in straight lines between its rows. */
export function waterDensity(tempC: number, what = 'The temperature'): number {
  if (!Number.isFinite(tempC) || tempC < HYDROMETER_TEMP_MIN_C || tempC > HYDROMETER_TEMP_MAX_C) {
    throw new RangeError(`${what} must be from ${HYDROMETER_TEMP_MIN_C} to ${HYDROMETER_TEMP_MAX_C} °C; got ${tempC}`)
  }
  const rows = WATER_DENSITY_TABLE
  const i = Math.max(0, rows.findIndex(([t], k) => tempC >= t && tempC <= rows[k + 1]![0]))
  const [t0, d0] = rows[i]!
  const [t1, d1] = rows[i + 1]!
  return d0 + ((d1 - d0) * (tempC - t0)) / (t1 - t0)
}

/**
 * Gravity points (0.001 SG) a reading at `tempC` gains when corrected to a hydrometer
 * calibrated at `calibrationC`: positive when the liquid is warmer than the calibration.
 * This is the Lyons (HBD #963) table's "correction" column, relative to any calibration temperature.
 */
export function hydrometerCorrectionPoints(tempC: number, calibrationC: number): number {
  return (waterDensity(calibrationC, 'The hydrometer calibration temperature') - waterDensity(tempC, 'The juice temperature')) * 1000
}

/** The SG a hydrometer calibrated at `calibrationC` would read at its own temperature. */
export function correctHydrometerSg(sgAsRead: number, tempC: number, calibrationC: number): number {
  if (!Number.isFinite(sgAsRead) || sgAsRead <= 0) {
    throw new RangeError(`Specific gravity must be a positive number; got ${sgAsRead}`)
  }
  return sgAsRead + hydrometerCorrectionPoints(tempC, calibrationC) / 1000
}
