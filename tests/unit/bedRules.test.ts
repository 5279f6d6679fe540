import { describe, expect, it } from 'vitest'
import { BED_RECORDS_BY_KIND, type BedRecordKind } from '../../shared/schemas/nursery'
import { bedFieldIssues, bedRecordIssues, BED_FIELDS_BY_KIND, nurserySeason } from '../../shared/utils/bedRules'
import { budwoodFieldIssues } from '../../shared/utils/budwoodRules'

const paths = (issues: { path: string }[]) => issues.map(i => i.path)

describe('what each kind of bed names', () => {
  it('asks a stool bed for its rootstock, mother plants and year established', () => {
    expect(paths(bedFieldIssues('stool', {}))).toEqual(['rootstockId', 'motherPlants', 'yearEstablished'])
    expect(bedFieldIssues('stool', { rootstockId: 3, motherPlants: 400, yearEstablished: 2015 })).toEqual([])
  })

  it('asks a cutting bed for its rootstock and refuses mother plants, which are a stool bed\'s', () => {
    expect(paths(bedFieldIssues('cutting', {}))).toEqual(['rootstockId'])
    const issues = bedFieldIssues('cutting', { rootstockId: 3, motherPlants: 10 })
    expect(issues).toEqual([{ path: 'motherPlants', message: 'A cutting bed has no mother plants: leave it empty' }])
  })

  it('asks a seedling bed for its seed source; its rootstock may be named', () => {
    expect(paths(bedFieldIssues('seedling', { rootstockId: 9 }))).toEqual(['seedSource'])
    expect(bedFieldIssues('seedling', { seedSource: 'Bittenfelder seed, 2024' })).toEqual([])
  })

  it('refuses each of them on a nursery-row field, naming the field sent', () => {
    expect(BED_FIELDS_BY_KIND.field).toEqual({ required: [], optional: [] })
    expect(paths(bedFieldIssues('field', { rootstockId: 3, seedSource: 'x' }))).toEqual(['rootstockId', 'seedSource'])
    expect(bedFieldIssues('field', { rootstockId: null, motherPlants: null })).toEqual([])
  })

  it('checks only the fields a patch sent for not applying, and every needed field after it', () => {
    // A stored stool bed patched to drop its rootstock: refused, naming the rootstock.
    expect(paths(bedFieldIssues('stool', { rootstockId: null, motherPlants: 10, yearEstablished: 2020 }, ['rootstockId']))).toEqual(['rootstockId'])
    expect(bedFieldIssues('cutting', { rootstockId: 1, motherPlants: 5 }, ['rootstockId'])).toEqual([])
  })
})

describe('yearly records per kind of bed', () => {
  it('keeps the records the schema lists per kind, and refuses others naming the kind', () => {
    expect(bedRecordIssues('stool', { kind: 'cut-back' })).toEqual([])
    expect(paths(bedRecordIssues('stool', { kind: 'cuttings-stuck', count: 10, hormone: 'IBA', hormoneStrength: '0.3 %' }))).toEqual(['kind'])
    expect(bedRecordIssues('field', { kind: 'liners-lifted', count: 1, grade: '5-7mm' })[0]!.message).toMatch(/no yearly records/)
    // Every record a bed of any kind keeps passes for that kind once its facts are given.
    for (const [bedKind, kinds] of Object.entries(BED_RECORDS_BY_KIND) as [keyof typeof BED_RECORDS_BY_KIND, readonly BedRecordKind[]][]) {
      for (const kind of kinds) expect(paths(bedRecordIssues(bedKind, { kind, count: 1, grade: '5-7mm', hormone: 'IBA', hormoneStrength: '0.3 %' }))).not.toContain('kind')
    }
  })

  it('needs a count and a grade for liners lifted, and no hormone', () => {
    expect(paths(bedRecordIssues('stool', { kind: 'liners-lifted' }))).toEqual(['count', 'grade'])
    expect(paths(bedRecordIssues('stool', { kind: 'liners-lifted', count: 500, grade: '5-7mm', hormone: 'IBA' }))).toEqual(['hormone'])
  })

  it('needs a count, hormone and strength for cuttings stuck, and a count for rooted cuttings and raised seedlings', () => {
    expect(paths(bedRecordIssues('cutting', { kind: 'cuttings-stuck', count: 2000 }))).toEqual(['hormone', 'hormoneStrength'])
    expect(paths(bedRecordIssues('cutting', { kind: 'rooted' }))).toEqual(['count'])
    expect(paths(bedRecordIssues('seedling', { kind: 'seedlings-raised', grade: '3-5mm' }))).toEqual(['count', 'grade'])
  })

  it('takes no count for cutting back or earthing up', () => {
    expect(paths(bedRecordIssues('stool', { kind: 'earthed-up', count: 3 }))).toEqual(['count'])
  })
})

describe('the nursery season of a date', () => {
  it('is the calendar year in the north, where a stool bed is cut back in spring and lifted in late autumn', () => {
    expect(nurserySeason('2025-03-10')).toBe('2025')
    expect(nurserySeason('2025-11-20', 'north')).toBe('2025')
  })

  it('runs July to June in the south, six months on', () => {
    expect(nurserySeason('2025-09-15', 'south')).toBe('2025–26')
    expect(nurserySeason('2026-05-30', 'south')).toBe('2025–26')
    expect(nurserySeason('2026-07-01', 'south')).toBe('2026–27')
    expect(nurserySeason('2099-12-01', 'south')).toBe('2099–00')
  })
})

describe('what a lot of budwood names', () => {
  it('asks wood from a block for the block, and refuses a supplier', () => {
    expect(paths(budwoodFieldIssues('own-block', {}))).toEqual(['blockId'])
    expect(paths(budwoodFieldIssues('own-block', { blockId: 4, supplier: 'A nursery' }))).toEqual(['supplier'])
    expect(budwoodFieldIssues('own-block', { blockId: 4, sourceNote: 'row 3, trees 10-14' })).toEqual([])
  })

  it('asks wood from a single tree which tree, and refuses a block', () => {
    expect(paths(budwoodFieldIssues('own-tree', {}))).toEqual(['sourceNote'])
    expect(paths(budwoodFieldIssues('own-tree', { sourceNote: 'Old tree by the gate', blockId: 4 }))).toEqual(['blockId'])
  })

  it('asks bought-in wood for its supplier and certificate', () => {
    expect(paths(budwoodFieldIssues('bought', {}))).toEqual(['supplier', 'certificate'])
    expect(budwoodFieldIssues('bought', { supplier: 'Budwood Co', certificate: 'GB-123 / 2025-0042' })).toEqual([])
  })
})
