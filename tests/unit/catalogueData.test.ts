import { snakeCase } from 'scule'
import { describe, expect, it } from 'vitest'
import { NURSERY_ROOTSTOCKS } from '../../server/db/migrations/20261202_0009_nursery_rootstocks'
import { rootstocks, varieties } from '../../server/db/seeds/data/catalogue'
import { isClassOf } from '#shared/utils/juiceClass'

// What a juice test can show, so a figure from another measure or a slip of a decimal point stands out:
// - tannin 0.5–4.5 g/L for cider apples and perry pears (common practice);
// - TA 1.0–20 g/L as malic for cider apples (A. Lea, "Cider Apple Compositional Data": 1.1–19.1 g/L);
// - TA 1.5–12 g/L for perry pears (Brooks & Olmo perry pear figures 2.9–6.2 g/L; derived range).
const PLAUSIBLE = {
  apple: { tannin: [0.5, 4.5], ta: [1.0, 20] },
  pear: { tannin: [0.5, 4.5], ta: [1.5, 12] },
} as const

describe('the reference catalogue', () => {
  it.each(varieties.map(v => [v.name, v] as const))('%s has plausible juice figures and a class its species has', (_name, v) => {
    const range = PLAUSIBLE[v.species]
    if (v.typicalTanninGPerL !== null) {
      expect(v.typicalTanninGPerL).toBeGreaterThanOrEqual(range.tannin[0])
      expect(v.typicalTanninGPerL).toBeLessThanOrEqual(range.tannin[1])
    }
    if (v.typicalTaGPerL !== null) {
      expect(v.typicalTaGPerL).toBeGreaterThanOrEqual(range.ta[0])
      expect(v.typicalTaGPerL).toBeLessThanOrEqual(range.ta[1])
    }
    expect(isClassOf(v.species, v.juiceClass)).toBe(true)
    expect(v.source).toBeTruthy()
  })

  // Pollard and Beech's perry pear lists (cider-making.co.uk): medium sharp and bittersharp pears.
  it('gives the perry pears their published classes', () => {
    const classOf = (name: string) => varieties.find(v => v.name === name)?.juiceClass
    for (const name of ['Blakeney Red', 'Yellow Huffcap', 'Brandy', 'Gin']) expect(classOf(name), name).toBe('medium sharp')
    for (const name of ['Butt', 'Moorcroft']) expect(classOf(name), name).toBe('bittersharp')
    expect(classOf('Hendre Huffcap')).toBe('sweet')
  })

  it('keeps Medaille d\'Or bittersweet without the tannin figure of another measure', () => {
    const medaille = varieties.find(v => v.name === "Medaille d'Or")!
    expect(medaille.juiceClass).toBe('bittersweet')
    expect(medaille.typicalTanninGPerL).toBeNull()
    expect(medaille.source).toMatch(/different measure/)
  })

  it('stores no acid figure whose note does not bear it out', () => {
    const alford = varieties.find(v => v.name === 'Sweet Alford')!
    expect(alford.typicalTaGPerL).toBeNull()
    const bramley = varieties.find(v => v.name === "Bramley's Seedling")!
    // Goverd et al.: 1.43 % as malic.
    expect(bramley.typicalTaGPerL).toBe(14.3)
    expect(bramley.source).toContain('1.43 %')
  })

  // NC State Extension, 'Apple Rootstocks and Tree Spacing', Table 1 (fruit bearing age).
  it.each([
    ['M.26', 2, 4], ['M.7', 3, 4], ['MM.106', 3, 4], ['MM.111', 4, 6], ['Seedling', 6, 10],
  ] as const)('%s comes into bearing at %s–%s years (NC State Table 1)', (designation, early, late) => {
    const r = rootstocks.find(x => x.designation === designation)!
    expect([r.yearsToFirstCrop, r.yearsToFirstCropLate]).toEqual([early, late])
  })

  it('keeps every rootstock\'s bearing range and full bearing in order', () => {
    for (const r of rootstocks) {
      if (r.yearsToFirstCrop === null) continue
      if (r.yearsToFirstCropLate !== null) expect(r.yearsToFirstCropLate, r.designation).toBeGreaterThanOrEqual(r.yearsToFirstCrop)
      if (r.yearsToFullBearing !== null) expect(r.yearsToFullBearing, r.designation).toBeGreaterThanOrEqual(r.yearsToFirstCrop)
    }
  })

  // WVU Extension 'Pear Rootstocks': OHxF 87 makes about 85–90 % of a standard tree, so its spacing and
  // yield must be a near-standard tree's: no more fruit a hectare than pear seedling, the standard.
  it('gives OHxF 87 a near-standard tree\'s room and no more fruit a hectare than pear seedling', () => {
    const perHa = (r: typeof rootstocks[number]) => (10_000 / (r.inRowM! * r.betweenRowM!)) * r.yieldPerTreeKg!
    const ohxf87 = rootstocks.find(r => r.designation === 'OHxF 87')!
    const seedling = rootstocks.find(r => r.designation === 'Pear seedling')!
    expect(ohxf87.sizePctOfSeedling).toBeGreaterThanOrEqual(85)
    expect(ohxf87.inRowM! * ohxf87.betweenRowM!).toBeGreaterThan(0.5 * seedling.inRowM! * seedling.betweenRowM!)
    expect(perHa(ohxf87)).toBeLessThanOrEqual(perHa(seedling) * 1.05)
    // And no rootstock's stated spacing and yield outdo every other's per hectare by a wide margin.
    const all = rootstocks.filter(r => r.inRowM && r.betweenRowM && r.yieldPerTreeKg).map(perHa).sort((a, b) => b - a)
    expect(all[0]! / all[1]!).toBeLessThan(1.5)
  })

  describe('the rootstocks a nursery propagates', () => {
    const stock = (designation: string) => rootstocks.find(r => r.designation === designation)!

    // About half a seedling tree (common practice); the Treco description of Geneva 890 gives
    // 40–50 % of seedling in Washington State and 60–65 % in New York, free standing; eXtension
    // lists it with the semi-dwarfing rootstocks.
    it('has G.890 as a free-standing semi-dwarf of about half a seedling\'s size', () => {
      const g890 = stock('G.890')
      expect(g890).toMatchObject({ species: 'apple', vigour: 'semi-dwarf', sizePctOfSeedling: 50, needsSupport: false })
      expect(g890.sizePctOfSeedling).toBeGreaterThanOrEqual(40)
      expect(g890.sizePctOfSeedling).toBeLessThanOrEqual(65)
      expect(g890.source).toMatch(/Treco/)
      expect(g890.source).toMatch(/common practice/)
    })

    // eXtension, 'Apple Rootstock Info: Mark': 35–40 % of standard, very early precocity, tree support needed.
    it('has Mark as a dwarfing stock that needs support, at the size its source gives', () => {
      const mark = stock('Mark')
      expect(mark).toMatchObject({ species: 'apple', vigour: 'dwarf', needsSupport: true })
      expect(mark.sizePctOfSeedling).toBeGreaterThanOrEqual(35)
      expect(mark.sizePctOfSeedling).toBeLessThanOrEqual(40)
      expect(mark.yearsToFirstCrop).toBeLessThanOrEqual(stock('M.26').yearsToFirstCrop!)
      expect(mark.source).toMatch(/Apple Rootstock Info: Mark/)
    })

    it('marks every figure of theirs that no source gives as from memory', () => {
      for (const designation of ['Mark', 'G.890']) {
        const r = stock(designation)
        expect(r.source.length, designation).toBeLessThanOrEqual(1000)
        expect(r.source, designation).toMatch(/from memory/)
        for (const figure of [r.inRowM, r.betweenRowM, r.yearsToFirstCrop, r.yearsToFirstCropLate, r.yearsToFullBearing, r.yieldPerTreeKg]) expect(figure).not.toBeNull()
      }
    })

    // The migration adds them to a catalogue seeded before; a new one gets them from this file. Both must end the same.
    it('adds exactly the data file\'s rows in the migration that brings them to an older catalogue', () => {
      const fromData = NURSERY_ROOTSTOCKS.map(row => Object.fromEntries(Object.entries(stock(row.designation)).map(([k, v]) => [snakeCase(k), v])))
      expect(NURSERY_ROOTSTOCKS).toEqual(fromData)
      expect(NURSERY_ROOTSTOCKS.map(r => r.designation).sort()).toEqual(['G.890', 'Mark'])
    })
  })
})
