// Seasonal dates (budding, lifting, harvest windows) are published for the northern hemisphere;
// in the southern hemisphere the same season falls six months later (August budding in England is
// February budding in New Zealand).

export const HEMISPHERES = ['north', 'south'] as const
export type Hemisphere = typeof HEMISPHERES[number]

export interface MonthDay {
  /** 1–12 */
  month: number
  /** 1–31, within the month */
  day: number
}

// February counts 29 days: a season's date has no year, so 29 February is allowed.
const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const

function checkMonthDay({ month, day }: MonthDay): void {
  if (!Number.isInteger(month) || month < 1 || month > 12) throw new RangeError(`No month ${month}: use 1 to 12`)
  const last = DAYS_IN_MONTH[month - 1]!
  if (!Number.isInteger(day) || day < 1 || day > last) throw new RangeError(`No day ${day} in month ${month}: use 1 to ${last}`)
}

/**
 * A northern-hemisphere seasonal date as it falls in `hemisphere`: unchanged in the north, six
 * months on in the south. A day past the end of the new month falls on its last day (31 August →
 * 28 February, since a season's date has no year to say whether February has 29 days).
 */
export function seasonalMonthDay(date: MonthDay, hemisphere: Hemisphere): MonthDay {
  checkMonthDay(date)
  if (hemisphere === 'north') return { month: date.month, day: date.day }
  const month = ((date.month + 5) % 12) + 1
  const last = month === 2 ? 28 : DAYS_IN_MONTH[month - 1]!
  return { month, day: Math.min(date.day, last) }
}
