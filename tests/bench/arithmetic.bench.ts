import { bench, describe } from 'vitest'
import { abvFromGravity } from '../../shared/utils/alcohol'
import { sumForecastByClass } from '../../shared/utils/forecast'
import { juiceClass } from '../../shared/utils/juiceClass'
import { brixToSg, sgToBrix } from '../../shared/utils/sugar'

// Targets: a season's lab sheet (1,000 readings) converts in well under 10 ms; an organisation's
// 15-year forecast over 500 blocks in well under 50 ms, so pages never wait on the arithmetic.
const readings = Array.from({ length: 1000 }, (_, i) => ({ brix: 8 + (i % 160) / 10, ta: 2 + (i % 90) / 10, tannin: (i % 40) / 10 }))
const classes = ['sweet', 'sharp', 'bittersweet', 'bittersharp'] as const
const blocks = Array.from({ length: 500 }, (_, i) => ({
  trees: 200 + (i % 7) * 50,
  yearPlanted: 2005 + (i % 20),
  survivalRate: 0.95,
  juiceClass: classes[i % 4]!,
  curve: { yearsToFirstCrop: 3 + (i % 3), yearsToFullBearing: 7 + (i % 4), yieldPerTreeKgAtFull: 30 + (i % 5) * 10 },
}))

describe('lab sheet of 1,000 readings', () => {
  bench('°Brix → SG → °Brix, potential alcohol and juice class', () => {
    for (const r of readings) {
      const sg = brixToSg(r.brix)
      sgToBrix(sg)
      abvFromGravity(sg, 1.0, 'hall')
      juiceClass(r.ta, r.tannin)
    }
  })
})

describe('organisation forecast', () => {
  bench('500 blocks × 15 years by juice class', () => {
    sumForecastByClass(blocks, { startYear: 2027, years: 15 })
  })
})
