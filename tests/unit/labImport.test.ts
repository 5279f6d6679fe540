import { describe, expect, it } from 'vitest'
import {
  checkRows, headersKeyText, lotsByCode, mappingHeaderIssues, parseSheetDate, parseSheetNumber, suggestMapping, suggestUnits, type ColumnMapping,
} from '#shared/utils/labImport'

describe('parseSheetDate', () => {
  it('reads a day in each of the three formats', () => {
    // Calendar: 14 October 2025 written three ways (common practice: ISO 8601, UK and US order).
    expect(parseSheetDate('2025-10-14', 'YYYY-MM-DD')).toBe('2025-10-14')
    expect(parseSheetDate('14/10/2025', 'DD/MM/YYYY')).toBe('2025-10-14')
    expect(parseSheetDate('10/14/2025', 'MM/DD/YYYY')).toBe('2025-10-14')
    expect(parseSheetDate('3/9/2025', 'DD/MM/YYYY')).toBe('2025-09-03') // common practice: single-digit day and month
    expect(parseSheetDate('3/9/2025', 'MM/DD/YYYY')).toBe('2025-03-09')
  })

  it('refuses a day the calendar does not have, rather than rolling it on', () => {
    // Gregorian calendar: February has 28 days, 29 in a leap year (2024 is one, 2025 is not) (common practice).
    expect(parseSheetDate('31/02/2025', 'DD/MM/YYYY')).toBeNull()
    expect(parseSheetDate('29/02/2025', 'DD/MM/YYYY')).toBeNull()
    expect(parseSheetDate('29/02/2024', 'DD/MM/YYYY')).toBe('2024-02-29')
    expect(parseSheetDate('2025-04-31', 'YYYY-MM-DD')).toBeNull() // April has 30 days (common practice)
    expect(parseSheetDate('14/10/2025', 'MM/DD/YYYY')).toBeNull() // there is no month 14
  })

  it('takes a year-first date whatever the format, and refuses a slashed date when ISO is chosen', () => {
    expect(parseSheetDate('2025-10-14', 'DD/MM/YYYY')).toBe('2025-10-14')
    expect(parseSheetDate('14/10/2025', 'YYYY-MM-DD')).toBeNull()
    expect(parseSheetDate('yesterday', 'DD/MM/YYYY')).toBeNull()
  })
})

describe('parseSheetNumber', () => {
  it('reads numbers with a decimal point, and with thousands commas', () => {
    expect(parseSheetNumber('12.5', false)).toEqual({ ok: true, value: 12.5 })
    expect(parseSheetNumber('1,234.5', false)).toEqual({ ok: true, value: 1234.5 })
    expect(parseSheetNumber('', false)).toEqual({ ok: true, value: null })
  })

  it('reads numbers with a decimal comma, and with thousands points', () => {
    // Common practice: continental European sheets write 1.234,5 for one thousand two hundred and thirty-four and a half.
    expect(parseSheetNumber('1.234,5', true)).toEqual({ ok: true, value: 1234.5 })
    expect(parseSheetNumber('3,42', true)).toEqual({ ok: true, value: 3.42 })
    expect(parseSheetNumber('12', true)).toEqual({ ok: true, value: 12 })
  })

  it('refuses the other decimal mark instead of guessing', () => {
    const point = parseSheetNumber('1.050', true)
    expect(point.ok).toBe(false)
    expect(!point.ok && point.message).toMatch(/decimal point/)
    const comma = parseSheetNumber('12,5', false)
    expect(comma.ok).toBe(false)
    expect(!comma.ok && comma.message).toMatch(/decimal comma/)
    expect(parseSheetNumber('n/a', false).ok).toBe(false)
  })
})

describe('headers', () => {
  it('keys the header row trimmed, lower-cased and joined by tabs', () => {
    expect(headersKeyText([' Lot ', 'DATE', 'Brix'])).toBe('lot\tdate\tbrix')
    expect(headersKeyText(['lot', 'date', 'brix'])).toBe(headersKeyText([' LOT', 'Date ', 'BRIX']))
  })

  it('suggests a mapping from the names labs use', () => {
    const headers = ['Sample ID', 'Date sampled', '°Bx', 'SG', 'Temp (°C)', 'TA (% w/v tartaric)', 'pH', 'Tannin mg/L', 'YAN']
    const suggested = suggestMapping(headers)
    expect(suggested).toEqual({
      lotCode: 'Sample ID', sampledOn: 'Date sampled', brix: '°Bx', sg: 'SG', tempC: 'Temp (°C)',
      ta: 'TA (% w/v tartaric)', ph: 'pH', tannin: 'Tannin mg/L', yan: 'YAN',
    })
    expect(suggestUnits(headers, suggested)).toEqual({ taAs: 'tartaric', taUnit: '% w/v', tanninUnit: 'mg/L' })
    expect(suggestMapping(['Lot', 'Date', 'Brix', 'Notes'])).toEqual({ lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix' })
  })

  it('names each mapped column the sheet does not have', () => {
    const mapping: ColumnMapping = { lotCode: 'Lot', sampledOn: 'Date', brix: 'Sugar', taAs: 'malic', taUnit: 'g/L', tanninUnit: 'g/L' }
    expect(mappingHeaderIssues(mapping, ['Lot', 'Date', 'Brix'])).toEqual([{ path: 'mapping.brix', message: 'The sheet has no column "Sugar"' }])
    expect(mappingHeaderIssues({ ...mapping, brix: 'Brix' }, ['Lot', 'Date', 'Brix'])).toEqual([])
  })
})

describe('checkRows', () => {
  const lots = lotsByCode([
    { id: 1, code: 'HM-25-001', pickedOn: '2025-10-01', species: 'apple' },
    { id: 2, code: 'HM-25-002', pickedOn: '2025-10-10', species: 'pear' },
  ])
  const mapping: ColumnMapping = { lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix', ta: 'TA', taAs: 'malic', taUnit: 'g/L', tanninUnit: 'g/L' }
  const options = { dateFormat: 'DD/MM/YYYY', decimalComma: false } as const
  const context = { lots, today: '2025-11-01' }
  const none = () => []

  it('reads good rows by the mapping, matching lot codes ignoring case', () => {
    const table = { headers: ['Lot', 'Date', 'Brix', 'TA'], rows: [['HM-25-001', '14/10/2025', '12.5', '6.1'], ['hm-25-002', '15/10/2025', '', '2']] }
    const checked = checkRows(table, mapping, options, context, none)
    expect(checked.issues).toEqual([])
    expect(checked.good.map(r => [r.row, r.lot.id, r.sampledOn, r.values.brix, r.values.ta])).toEqual([
      [2, 1, '2025-10-14', 12.5, 6.1],
      [3, 2, '2025-10-15', null, 2],
    ])
  })

  it('names the row (header is row 1) and the field of every fault', () => {
    const table = {
      headers: ['Lot', 'Date', 'Brix', 'TA'],
      rows: [
        ['HM-25-999', '14/10/2025', '12', '6'], // unknown lot
        ['HM-25-001', '31/02/2025', '12', '6'], // no such day
        ['HM-25-001', '02/11/2025', '12', '6'], // after today
        ['HM-25-002', '05/10/2025', '12', '6'], // before the lot was picked
        ['HM-25-001', '14/10/2025', '12,5', '6'], // decimal comma on a decimal-point sheet
        ['HM-25-001', '14/10/2025', '13', '6'], // good
        ['HM-25-001', '14/10/2025', '13', '6'], // same lot and day as row 7
        ['', '', '', ''], // blank: not a row
      ],
    }
    const checked = checkRows(table, mapping, options, context, none)
    expect(checked.issues.map(i => [i.row, i.field])).toEqual([
      [2, 'lotCode'], [3, 'sampledOn'], [4, 'sampledOn'], [5, 'sampledOn'], [6, 'brix'], [8, 'sampledOn'],
    ])
    expect(checked.issues.find(i => i.row === 8)!.message).toBe('Row 7 already has lot HM-25-001 on 2025-10-14')
    expect(checked.issues.find(i => i.row === 5)!.message).toMatch(/before the lot was picked \(2025-10-10\)/)
    expect(checked.badRows).toEqual([2, 3, 4, 5, 6, 8])
    expect(checked.good.map(r => r.row)).toEqual([7])
  })

  it('reports the reading checks by row and mapped field', () => {
    const table = { headers: ['Lot', 'Date', 'Brix', 'TA'], rows: [['HM-25-001', '14/10/2025', '45', '6']] }
    const checked = checkRows(table, mapping, options, context, r => (r.values.brix! > 30 ? [{ field: 'brix', message: 'Too high' }] : []))
    expect(checked.issues).toEqual([{ row: 2, field: 'brix', message: 'Too high' }])
    expect(checked.good).toEqual([])
  })

  it('checks 10,000 rows well under a second', () => {
    const rows = Array.from({ length: 10_000 }, (_, i) => [i % 2 ? 'HM-25-001' : 'HM-25-002', `${String(1 + (i % 20)).padStart(2, '0')}/10/2025`, '12.5', '6.1'])
    const started = performance.now()
    checkRows({ headers: ['Lot', 'Date', 'Brix', 'TA'], rows }, mapping, options, context, none)
    expect(performance.now() - started).toBeLessThan(500)
  })
})
