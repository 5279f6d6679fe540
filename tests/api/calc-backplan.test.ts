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
})
