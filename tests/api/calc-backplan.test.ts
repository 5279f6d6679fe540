import { describe, expect, it } from 'vitest'
import { as } from '../support/http'

const get = async (query: string) => (await as('anonymous')).get(`/api/calc/backplan?${query}`)
const issuePaths = (body: { data: { issues: { path: string }[] } }) => body.data.issues.map(i => i.path)

describe('nursery back-plan calculator', () => {
  it('dates each step back from an autumn delivery and counts the rootstocks to bud', async () => {
    const res = await get('deliveryYear=2028&season=autumn&trees=500&takePct=85&survivalPct=90')
    expect(res.status).toBe(200)
    // Cycle order and seasons: R. Crassweller, Penn State, "Nursery Production of Finished Apple Trees"
    // (liners in spring, budded in late summer, headed back the next spring, dug in autumn);
    // the days of the month are common practice.
    expect(res.body.steps).toEqual([
      { step: 'linersPlanted', by: '2027-04-30' },
      { step: 'budded', by: '2027-09-30' },
      { step: 'headedBack', by: '2028-03-31' },
      { step: 'dug', by: '2028-11-15' },
      { step: 'delivered', by: '2028-11-30' },
    ])
    // Worked example: 500 ÷ (0.85 × 0.90) = 653.6, rounded up to whole rootstocks.
    expect(res.body).toMatchObject({ deliveryYear: 2028, season: 'autumn', trees: 500, rootstocksToBud: 654 })
  })

  it('for a spring delivery the trees are dug the autumn before', async () => {
    const { body } = await get('deliveryYear=2029&season=spring&trees=900&takePct=100&survivalPct=90')
    expect(body.steps.map((s: { by: string }) => s.by)).toEqual(['2027-04-30', '2027-09-30', '2028-03-31', '2028-11-15', '2029-04-15'])
    // Worked example: 900 ÷ 0.9 is exactly 1,000; binary rounding must not make it 1,001.
    expect(body.rootstocksToBud).toBe(1000)
  })

  it('names each bad field', async () => {
    const cases: [string, string][] = [
      ['season=autumn&trees=500&takePct=85&survivalPct=90', 'deliveryYear'],
      ['deliveryYear=2028.5&season=autumn&trees=500&takePct=85&survivalPct=90', 'deliveryYear'],
      ['deliveryYear=2028&season=winter&trees=500&takePct=85&survivalPct=90', 'season'],
      ['deliveryYear=2028&season=autumn&trees=abc&takePct=85&survivalPct=90', 'trees'],
      ['deliveryYear=2028&season=autumn&trees=0&takePct=85&survivalPct=90', 'trees'],
      ['deliveryYear=2028&season=autumn&trees=500&takePct=0&survivalPct=90', 'takePct'],
      ['deliveryYear=2028&season=autumn&trees=500&takePct=85&survivalPct=120', 'survivalPct'],
    ]
    for (const [query, field] of cases) {
      const res = await get(query)
      expect(res.status, query).toBe(400)
      expect(issuePaths(res.body), query).toContain(field)
    }
  })

  // Tree types and interstems, hand-worked. Seasons: a sleeping eye dug the spring after budding and a
  // bench graft grown one season (Good Fruit Grower, "Types of trees"); a knip tree and a double-worked
  // tree one season more each (Good Fruit Grower, "Types of trees"; double chip-budding in successive
  // years), both together two (common practice). Days of the month are common practice.
  const plan = 'trees=500&takePct=85&survivalPct=90'

  it('a knip tree on an interstem for autumn 2028 starts four growing seasons before digging', async () => {
    const res = await get(`deliveryYear=2028&season=autumn&${plan}&treeType=knip&interstem=true`)
    expect(res.status).toBe(200)
    expect(res.body.steps).toEqual([
      { step: 'linersPlanted', by: '2025-04-30' },
      { step: 'interstemBudded', by: '2025-09-30' },
      { step: 'interstemHeadedBack', by: '2026-03-31' },
      { step: 'budded', by: '2026-09-30' },
      { step: 'headedBack', by: '2027-03-31' },
      { step: 'knipCutBack', by: '2028-03-31' },
      { step: 'dug', by: '2028-11-15' },
      { step: 'delivered', by: '2028-11-30' },
    ])
    // The rootstock count does not depend on the tree type: 500 ÷ 0.765 = 653.6 → 654 (worked example).
    expect(res.body).toMatchObject({ treeType: 'knip', interstem: true, rootstocksToBud: 654 })
  })

  it('a sleeping eye for spring 2029 is budded the summer before and dug by mid-March, with no heading back', async () => {
    const { body } = await get(`deliveryYear=2029&season=spring&${plan}&treeType=sleeping-eye&interstem=false`)
    expect(body.steps).toEqual([
      { step: 'linersPlanted', by: '2028-04-30' },
      { step: 'budded', by: '2028-09-30' },
      { step: 'dug', by: '2029-03-15' },
      { step: 'delivered', by: '2029-04-15' },
    ])
  })

  it('a bench graft for autumn 2028 is grafted that late winter and never budded', async () => {
    const { body } = await get(`deliveryYear=2028&season=autumn&${plan}&treeType=bench-graft`)
    expect(body.steps.map((s: { step: string, by: string }) => `${s.step} ${s.by}`)).toEqual([
      'benchGrafted 2028-03-15', 'linersPlanted 2028-04-30', 'dug 2028-11-15', 'delivered 2028-11-30',
    ])
  })

  it('a maiden on an interstem takes one season more than one without', async () => {
    const { body } = await get(`deliveryYear=2028&season=spring&${plan}&treeType=maiden&interstem=true`)
    expect(body.steps.map((s: { by: string }) => s.by)).toEqual(['2025-04-30', '2025-09-30', '2026-03-31', '2026-09-30', '2027-03-31', '2027-11-15', '2028-04-15'])
  })

  it('says which tree it planned when the tree type and interstem are left out: a maiden on its rootstock alone', async () => {
    const { body } = await get(`deliveryYear=2028&season=autumn&${plan}`)
    expect(body).toMatchObject({ treeType: 'maiden', interstem: false })
  })

  it('names the tree type or interstem when they are wrong or cannot go together', async () => {
    const cases: [string, string, RegExp][] = [
      ['treeType=whip', 'treeType', /Choose a tree type/],
      ['interstem=yes', 'interstem', /Say true or false/],
      ['interstem=1', 'interstem', /Say true or false/],
      ['treeType=sleeping-eye&interstem=true', 'interstem', /A sleeping eye cannot be on an interstem/],
      ['treeType=bench-graft&interstem=true', 'interstem', /A bench graft cannot be on an interstem/],
    ]
    for (const [extra, field, message] of cases) {
      const res = await get(`deliveryYear=2028&season=autumn&${plan}&${extra}`)
      expect(res.status, extra).toBe(400)
      expect(issuePaths(res.body), extra).toContain(field)
      const issue = res.body.data.issues.find((i: { path: string }) => i.path === field)
      expect(issue.message, extra).toMatch(message)
    }
  })
})
