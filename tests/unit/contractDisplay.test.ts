import { describe, expect, it } from 'vitest'
import { fruitTermsFields, treeTermsFields } from '../../shared/schemas/contract'
import {
  contractFieldLabel, contractHistoryLabel, contractTermChanges, contractMoneyMessage, contractValueText, figureFromText, formatContractMoney, FRUIT_FIELD_LABELS, optionalFigureFromText,
  fruitContractWhat, majorTextFromMinor, treeDeliveryText, minorFromMajorText, TREE_FIELD_LABELS,
} from '../../shared/utils/contractDisplay'

describe('contract money', () => {
  it('shows minor units as the currency’s own sum', () => {
    expect(formatContractMoney(123_450, 'GBP')).toBe('£1,234.50')
    expect(formatContractMoney(420, 'EUR')).toBe('€4.20')
    expect(formatContractMoney(0, 'USD')).toBe('US$0.00')
  })

  it('reads a sum typed in major units to the exact minor unit', () => {
    expect(minorFromMajorText('4.20')).toBe(420)
    expect(minorFromMajorText('4.1')).toBe(410)
    // 0.29 × 100 is 28.999… in binary floating point: worked on the digits it is 29.
    expect(minorFromMajorText('0.29')).toBe(29)
    expect(minorFromMajorText(' 1,250 ')).toBe(125_000)
    expect(minorFromMajorText('12')).toBe(1200)
    expect(minorFromMajorText(7.5)).toBe(750)
    expect(minorFromMajorText('')).toBeUndefined()
  })

  it('refuses what is not a sum to the penny, for the schema to name', () => {
    for (const typed of ['4.205', 'four', '-3', '1,25', '£4']) expect(minorFromMajorText(typed), typed).toBeNaN()
  })

  it('gives minor units back as the text a person edits', () => {
    expect(majorTextFromMinor(420)).toBe('4.20')
    expect(majorTextFromMinor(5)).toBe('0.05')
    expect(majorTextFromMinor(125_000)).toBe('1250.00')
    expect(minorFromMajorText(majorTextFromMinor(98_765))).toBe(98_765)
  })

  it('reads other figures from their boxes, leaving empty ones out', () => {
    expect(figureFromText(' 400 ')).toBe(400)
    expect(figureFromText(0.85)).toBe(0.85)
    expect(figureFromText('')).toBeUndefined()
    expect(figureFromText('many')).toBeNaN()
    expect(optionalFigureFromText('')).toBeNull()
    expect(optionalFigureFromText('12.5')).toBe(12.5)
  })

  it('says a refused sum in the units that were typed', () => {
    expect(contractMoneyMessage('the price per tree', 10_000_000, 'GBP')).toBe('Enter the price per tree in GBP, from £0.00 to £100,000.00, to two decimal places')
  })
})

describe('contract words', () => {
  it('names every term of both kinds of contract in plain words', () => {
    expect(Object.keys(TREE_FIELD_LABELS).sort()).toEqual(Object.keys(treeTermsFields).sort())
    expect(Object.keys(FRUIT_FIELD_LABELS).sort()).toEqual(Object.keys(fruitTermsFields).sort())
    expect(contractFieldLabel('tree', 'unitPriceMinor')).toBe('Price per tree')
    expect(contractFieldLabel('fruit', 'rejectFloorBrix')).toBe('Reject floor')
    expect(contractFieldLabel('fruit', 'somethingNew')).toBe('something new')
  })

  it('names the moves of the history', () => {
    expect(contractHistoryLabel('countered')).toBe('Counter-offer')
    expect(contractHistoryLabel('offered')).toBe('Offer sent')
    expect(contractHistoryLabel('payment-received')).toBe('Payment received')
  })

  it('shows each kind of term’s value as a person reads it', () => {
    const context = { currency: 'GBP', catalogueName: (_: string, id: number) => (id === 7 ? 'Dabinett' : undefined) }
    expect(contractValueText('unitPriceMinor', 420, context)).toBe('£4.20')
    expect(contractValueText('varietyId', 7, context)).toBe('Dabinett')
    expect(contractValueText('rootstockId', 9, context)).toBe('catalogue entry 9')
    expect(contractValueText('takeRate', 0.85, context)).toBe('85 %')
    expect(contractValueText('depositPct', 12.5, context)).toBe('12.5 %')
    expect(contractValueText('baselineBrix', 11.5, context)).toBe('11.5 °Brix')
    expect(contractValueText('treeCount', 1200, context)).toBe('1,200')
    expect(contractValueText('deliveryYear', 2028, context)).toBe('2028')
    expect(contractValueText('certificateRequired', true, context)).toBe('yes')
    expect(contractValueText('treeType', 'knip', context)).toBe('Knip tree (two-year root, one-year top)')
    expect(contractValueText('interstem', null, context)).toBe('none')
    expect(contractValueText('interstem', 'M.9', context)).toBe('M.9')
    expect(contractValueText('expiresOn', '2027-03-01', context)).toBe('1 March 2027')
    expect(contractValueText('schedule', [
      { year: 2029, tonnes: 12, windowFrom: '2029-10-01', windowTo: '2029-11-15' },
      { year: 2028, tonnes: 10.5, windowFrom: '2028-09-20', windowTo: '2028-11-30' },
    ], context)).toBe('2028: 10.5 t, 20 September 2028 to 30 November 2028; 2029: 12 t, 1 October 2029 to 15 November 2029')
  })

  it('says when the trees come', () => {
    expect(treeDeliveryText('autumn', 2028)).toBe('Autumn 2028, straight from digging')
    expect(treeDeliveryText('spring', 2029)).toBe('Spring 2029, for planting')
  })

  it('says what a fruit contract is for', () => {
    expect(fruitContractWhat({ varietyName: 'Dabinett', species: null, juiceClass: null })).toBe('Dabinett')
    expect(fruitContractWhat({ varietyName: null, species: 'apple', juiceClass: 'bittersharp' })).toBe('bittersharp apples')
    expect(fruitContractWhat({ varietyName: null, species: 'pear', juiceClass: 'medium sharp' })).toBe('medium sharp perry pears')
  })
})

describe('what a counter-offer changes', () => {
  const current = {
    unitPriceMinor: 420, treeCount: 400, interstem: null, notes: 'Stake at planting',
    schedule: [{ year: 2028, tonnes: 10, windowFrom: '2028-09-01', windowTo: '2028-11-30' }],
  }

  it('keeps only the terms that differ from those in place', () => {
    expect(contractTermChanges({ unitPriceMinor: 395, treeCount: 400, interstem: null, notes: 'Stake at planting' }, current)).toEqual({ unitPriceMinor: 395 })
    expect(contractTermChanges({ interstem: 'M.9', notes: null }, current)).toEqual({ interstem: 'M.9', notes: null })
    expect(contractTermChanges({ treeCount: 400 }, current)).toEqual({})
  })

  it('compares a schedule by its contents, whatever the order of each year’s keys', () => {
    const same = [{ windowTo: '2028-11-30', windowFrom: '2028-09-01', tonnes: 10, year: 2028 }]
    expect(contractTermChanges({ schedule: same }, current)).toEqual({})
    const more = [...same, { year: 2029, tonnes: 12, windowFrom: '2029-09-01', windowTo: '2029-11-30' }]
    expect(contractTermChanges({ schedule: more }, current)).toEqual({ schedule: more })
  })
})
