import { orgId, userId, varietyId, type ORGS } from './contracts'
import { testDb } from './db'
import { nurseryFixtures } from './nursery'

// Budwood lots and the working events that use them, for the exposure tests: written straight into
// the test database in the nursery fixtures' own fields (so the same clean-up removes them), with
// the person and the day order a nursery's book of budding records.

export type WorkKind = 'budded' | 'grafted' | 'interstem-budded'

export function exposureFixtures(mark: string) {
  const db = testDb()
  const nursery = nurseryFixtures(mark)
  let lots = 0

  /** A lot of Dabinett budwood (or `variety`) of the organisation, labelled after the mark. */
  async function lot(options: { org?: keyof typeof ORGS, variety?: string, cutOn?: string } = {}): Promise<{ id: number, label: string }> {
    const label = `${mark} lot ${++lots} ${Date.now().toString(36)}`
    const [id] = await db('budwood_lots').insert({
      org_id: await orgId(options.org ?? 'hollowmere'), label, variety_id: await varietyId(options.variety ?? 'Dabinett'),
      cut_on: options.cutOn ?? '2023-07-01', source_kind: 'bought', supplier: 'Test supplier', sticks: 20,
    })
    return { id: id!, label }
  }

  /** One working event on a run: `by` (a demo sign-in) worked `count` of it on `on`, `dayOrder`-th that day, with `lotId` (or none). */
  async function work(runId: number, options: { on: string, by: string, lotId: number | null, dayOrder?: number | null, kind?: WorkKind, count?: number, org?: keyof typeof ORGS }): Promise<number> {
    const kind = options.kind ?? 'budded'
    const user = await db('users').where({ id: await userId(options.by) }).first('id', 'name') as { id: number, name: string }
    const [id] = await db('propagation_events').insert({
      org_id: await orgId(options.org ?? 'hollowmere'), run_id: runId, kind, happened_on: options.on, count: options.count ?? 50,
      method: kind === 'grafted' ? 'whip-and-tongue' : 'chip-bud', variety_id: kind === 'interstem-budded' ? null : await varietyId('Dabinett'),
      budwood_lot_id: options.lotId, day_order: options.dayOrder ?? null, by_user_id: user.id, by_name: user.name,
    })
    return id!
  }

  return { ...nursery, lot, work }
}
