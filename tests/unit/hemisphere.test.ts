import { describe, expect, it } from 'vitest'
import { seasonalMonthDay } from '../../shared/utils/hemisphere'

describe('seasonal dates by hemisphere', () => {
  it('leaves a northern date as it is', () => {
    expect(seasonalMonthDay({ month: 8, day: 15 }, 'north')).toEqual({ month: 8, day: 15 })
  })

  it('moves a date six months on in the south, across the turn of the year', () => {
    // Budding in mid-August in the north is mid-February in the south (common practice).
    expect(seasonalMonthDay({ month: 8, day: 15 }, 'south')).toEqual({ month: 2, day: 15 })
    expect(seasonalMonthDay({ month: 1, day: 10 }, 'south')).toEqual({ month: 7, day: 10 })
    expect(seasonalMonthDay({ month: 6, day: 30 }, 'south')).toEqual({ month: 12, day: 30 })
    expect(seasonalMonthDay({ month: 7, day: 1 }, 'south')).toEqual({ month: 1, day: 1 })
    expect(seasonalMonthDay({ month: 12, day: 31 }, 'south')).toEqual({ month: 6, day: 30 })
  })

  it('puts a day past the end of the new month on its last day', () => {
    expect(seasonalMonthDay({ month: 8, day: 31 }, 'south')).toEqual({ month: 2, day: 28 })
    expect(seasonalMonthDay({ month: 8, day: 29 }, 'south')).toEqual({ month: 2, day: 28 })
    expect(seasonalMonthDay({ month: 3, day: 31 }, 'south')).toEqual({ month: 9, day: 30 })
    expect(seasonalMonthDay({ month: 2, day: 29 }, 'south')).toEqual({ month: 8, day: 29 })
  })

  it('comes back to the same month after two shifts when the day exists in both', () => {
    for (let month = 1; month <= 12; month++) {
      const there = seasonalMonthDay({ month, day: 15 }, 'south')
      expect(seasonalMonthDay(there, 'south')).toEqual({ month, day: 15 })
    }
  })

  it('refuses a date that does not exist', () => {
    expect(() => seasonalMonthDay({ month: 13, day: 1 }, 'south')).toThrow(RangeError)
    expect(() => seasonalMonthDay({ month: 0, day: 1 }, 'north')).toThrow(RangeError)
    expect(() => seasonalMonthDay({ month: 4, day: 31 }, 'south')).toThrow(RangeError)
    expect(() => seasonalMonthDay({ month: 2, day: 30 }, 'north')).toThrow(RangeError)
    expect(() => seasonalMonthDay({ month: 5, day: 1.5 }, 'north')).toThrow(RangeError)
  })
})
