import type { Knex } from 'knex'

// Quillhurst's saved blend target: the medium-dry cider base it presses for (SG 1.050–1.056, TA
// 5.0–6.5 g/L as malic, tannin 1.6–2.4 g/L), a day's 6,000 L. The lots Tansy Row's bittersharp
// contract covers, with their readings (08_demo_lots.ts, 09_demo_deliveries.ts), meet it; the
// cheapest of them, TR-26-003, is the sharpest, so the TA maximum binds and the planner says what
// loosening it would save; TR-26-004, re-tested under the contract's reject floor, is left out as
// rejected. Written once,
// into an organisation with no targets yet; seeds run through the database edge (camelCase both ways).

const QUILLHURST = 'Quillhurst Cider Works'

export const DEMO_BLEND_TARGET = {
  name: 'Medium-dry base',
  sgMin: 1.05,
  sgMax: 1.056,
  taMinGPerL: 5.0,
  taMaxGPerL: 6.5,
  tanninMinGPerL: 1.6,
  tanninMaxGPerL: 2.4,
  volumeL: 6000,
  phNote: 'pH 3.4–3.7 (noted, not planned on)',
  notes: 'The house medium-dry base: bittersharp body with enough acid to keep it bright.',
} as const

export async function seed(knex: Knex): Promise<void> {
  const maker = await knex('organisations').where({ name: QUILLHURST }).first('id') as { id: number } | undefined
  if (!maker) {
    console.warn('Demo blend targets skipped: Quillhurst is not there (seed the demo accounts first).')
    return
  }
  if (await knex('blendTargets').where({ orgId: maker.id }).first('id')) return
  const owner = await knex('users').where({ email: 'maker@demo.test' }).first('id') as { id: number } | undefined
  await knex('blendTargets').insert({ orgId: maker.id, ...DEMO_BLEND_TARGET, createdByUserId: owner?.id ?? null, createdAt: new Date('2026-11-10T09:30:00Z'), updatedAt: new Date('2026-11-10T09:30:00Z') })
}
