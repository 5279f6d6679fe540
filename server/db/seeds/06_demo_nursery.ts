import type { Knex } from 'knex'
import type { LinerGrade, LossCause } from '../../../shared/schemas/nursery'
import { rootstocksToBud } from '../../../shared/utils/backplan'
import { runCounts } from '../../../shared/utils/runCounts'
import { newTagCode } from '../../utils/tagCode'

// Hollowmere's nursery as it stands in December 2026: two stool beds with this year's work and
// liner harvest, the liners they (and a supplier) gave, the nursery field's rows, the budwood cut in
// August, and the runs budded from it for Quillhurst's 1,200 Dabinett.
//
// The cycle (R. Crassweller, Penn State, eXtension "Nursery Production of Finished Apple Trees"):
// liners cut from the stool beds in late autumn, graded and cold-stored; lined out in early spring
// about 30 cm apart in rows about 1 m apart; budded in late summer about 15 cm above the soil;
// headed back the next spring while dormant. A maiden for spring 2028 is lined out in spring 2026
// (shared/utils/backplan.ts), so the Dabinett went out in April and was budded in August; heading
// back falls in March 2027. A new stool bed is cut back after its first season and earthed up the
// next, when its first liners are lifted (S. Hoying, Cornell, "Vegetative Rootstock and Finished
// Apple Tree Production", 2015). Yields per mother plant are common practice, not from a source.
//
// Two runs carry the warnings the nursery pages show: one budded with another variety than the
// one it is meant for, one whose printed tag is older than its last change of variety.
// Seeds run through the database edge: camelCase both ways.

const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
const QUILLHURST = 'Quillhurst Cider Works'
const INES = 'grower@demo.test'
const TOMAS = 'grower-member@demo.test'
type Person = typeof INES | typeof TOMAS

/** The tree contract the Dabinett runs serve, found by its terms; its rates size the runs. */
const DABINETT_CONTRACT = { variety: 'Dabinett', rootstock: 'MM.106', treeCount: 1200, deliveryYear: 2028, deliverySeason: 'spring', takeRate: 0.85, survivalRate: 0.9 } as const

interface DemoBedRecord { kind: 'cut-back' | 'earthed-up' | 'liners-lifted', doneOn: string, count: number | null, grade: LinerGrade | null, notes: string | null, by: Person }

/**
 * A stool bed's year: cut back in late winter, earthed up in early summer and again in mid-summer,
 * the rooted shoots lifted and graded by stem diameter in late autumn (one record per grade).
 */
function stoolYear(year: number, days: { cutBack: string, earthedUp: [string, string], lifted: string }, lifted: Partial<Record<LinerGrade, number>>): DemoBedRecord[] {
  return [
    { kind: 'cut-back', doneOn: `${year}-${days.cutBack}`, count: null, grade: null, notes: 'Stools cut back to 2-3 cm before the buds broke.', by: TOMAS },
    { kind: 'earthed-up', doneOn: `${year}-${days.earthedUp[0]}`, count: null, grade: null, notes: 'Shoots about 15 cm long: sawdust round their bases to 10 cm.', by: TOMAS },
    { kind: 'earthed-up', doneOn: `${year}-${days.earthedUp[1]}`, count: null, grade: null, notes: 'Ridged up again with soil from the alleys, to about 20 cm.', by: TOMAS },
    ...Object.entries(lifted).map(([grade, count]): DemoBedRecord => ({
      kind: 'liners-lifted', doneOn: `${year}-${days.lifted}`, count, grade: grade as LinerGrade, notes: 'Graded, bundled in fifties and cold-stored.', by: INES,
    })),
  ]
}

const STOOL_BEDS = [
  {
    name: 'Barn Stools', rootstock: 'MM.106', motherPlants: 1000, yearEstablished: 2011,
    notes: 'Semi-vigorous stock for the bush trees budded to order.',
    records: [
      ...stoolYear(2025, { cutBack: '02-26', earthedUp: ['06-09', '07-16'], lifted: '11-18' }, { '5-7mm': 880, '7-10mm': 1020 }),
      ...stoolYear(2026, { cutBack: '02-24', earthedUp: ['06-08', '07-15'], lifted: '11-17' }, { '5-7mm': 960, '7-10mm': 1140 }),
    ],
  },
  {
    name: 'Pond Stools', rootstock: 'M.9', motherPlants: 500, yearEstablished: 2025,
    notes: 'Dwarfing stock, planted in spring 2025; this autumn gave its first liners.',
    records: stoolYear(2026, { cutBack: '02-25', earthedUp: ['06-10', '07-17'], lifted: '11-19' }, { '5-7mm': 460, '7-10mm': 240 }),
  },
]

const BOUGHT_LINERS = [
  {
    rootstock: 'MM.106', grade: '7-10mm' as LinerGrade, count: 300, receivedOn: '2026-02-24',
    supplier: 'Greyling Rootstocks, Estry Marsh', certificate: 'UK plant passport GB-52841, lot GRS-2602-117',
    notes: 'Topped up the 7-10 mm grade for lining out in April.',
  },
]

const FIELD = { name: 'Nursery Field', notes: 'Rows about 1 m apart, running north to south below the stool beds.' }
const ROWS = ['10', '11', '12', '13', '14'].map(name => ({ name, positions: 600, spacingCm: 30 }))
const ROWS_MAPPED_ON = '2026-03-20'

const BUDWOOD = [
  {
    label: 'HM-BW-26-01', variety: 'Dabinett', cutOn: '2026-08-17', sourceKind: 'own-block', block: 'Long Ground',
    sourceNote: 'Rows 2-4, this season\'s shoots from the outside of the trees', supplier: null, certificate: null, sticks: 130,
    notes: 'Pencil-thick current-season shoots, leaf blades clipped; kept damp and cool until budded.',
  },
  {
    label: 'HM-BW-26-02', variety: 'Yarlington Mill', cutOn: '2026-08-17', sourceKind: 'own-block', block: 'Chapel Piece',
    sourceNote: 'Row 1', supplier: null, certificate: null, sticks: 40, notes: 'All the good shoots Chapel Piece had this year.',
  },
  {
    label: 'HM-BW-26-03', variety: 'Kingston Black', cutOn: '2026-08-24', sourceKind: 'bought', block: null,
    sourceNote: null, supplier: 'Coldharbour Fruit Trees, Upper Estry', certificate: 'UK plant passport GB-47306, lot CFT-26-0824', sticks: 50, notes: null,
  },
] as const

interface DemoEvent {
  kind: 'budded' | 'take-counted' | 'shoots-removed' | 'loss'
  on: string
  count?: number
  cause?: LossCause
  variety?: string
  budwood?: string
  dayOrder?: number
  passNo?: number
  notes?: string
  by: Person
}

interface DemoRun {
  row: string
  from: number
  to: number
  rootstock: string
  linerGrade: LinerGrade
  linedOutOn: string
  variety: string
  forContract: boolean
  /** When the variety last changed, where that was after lining out. */
  identityChangedOn?: string
  tagPrintedOn: string
  notes: string | null
  events: DemoEvent[]
}

const NOT_ESTABLISHED = 'Never broke bud after lining out.'
const STRIPPED = 'Side shoots rubbed off the lowest 25 cm, a clean stem to bud on.'
const TAKE = 'Chips green and the leaf stalks dropping at a touch.'
const chipBud = (on: string, count: number, variety: string, budwood: string, dayOrder: number): DemoEvent => ({ kind: 'budded', on, count, variety, budwood, dayOrder, by: TOMAS })

// One liner to a position. Rows 10-12 are the Dabinett contract's: as many liners as its back-plan
// asks for. Row 12 was budded from the Yarlington Mill sticks, which the page's warning catches.
// Row 13 was lined out for Yarlington Mill, for sale, and changed to Kingston Black when it was
// budded with bought-in wood: the tag printed in April still names the old variety.
const RUNS: DemoRun[] = [
  {
    row: '10', from: 1, to: 600, rootstock: 'MM.106', linerGrade: '7-10mm', linedOutOn: '2026-04-14', variety: 'Dabinett', forContract: true, tagPrintedOn: '2026-04-20', notes: null,
    events: [
      { kind: 'loss', on: '2026-06-10', count: 3, cause: 'other', notes: NOT_ESTABLISHED, by: TOMAS },
      { kind: 'shoots-removed', on: '2026-07-22', passNo: 1, notes: STRIPPED, by: TOMAS },
      chipBud('2026-08-18', 597, 'Dabinett', 'HM-BW-26-01', 1),
      { kind: 'take-counted', on: '2026-09-15', count: 527, notes: TAKE, by: INES },
      { kind: 'loss', on: '2026-11-12', count: 7, cause: 'rodents', notes: 'Voles under the grass strip at the south end: bark ringed below the bud.', by: TOMAS },
    ],
  },
  {
    row: '11', from: 1, to: 600, rootstock: 'MM.106', linerGrade: '7-10mm', linedOutOn: '2026-04-14', variety: 'Dabinett', forContract: true, tagPrintedOn: '2026-04-20', notes: null,
    events: [
      { kind: 'loss', on: '2026-07-09', count: 4, cause: 'fire-blight', notes: 'Shoot strikes after the hail of 2 July; cut out well below and burned.', by: INES },
      { kind: 'shoots-removed', on: '2026-07-22', passNo: 1, notes: STRIPPED, by: TOMAS },
      chipBud('2026-08-18', 596, 'Dabinett', 'HM-BW-26-01', 2),
      { kind: 'take-counted', on: '2026-09-15', count: 519, notes: TAKE, by: INES },
      { kind: 'loss', on: '2026-10-28', count: 5, cause: 'rodents', by: TOMAS },
    ],
  },
  {
    row: '12', from: 1, to: 369, rootstock: 'MM.106', linerGrade: '5-7mm', linedOutOn: '2026-04-15', variety: 'Dabinett', forContract: true, tagPrintedOn: '2026-04-20', notes: null,
    events: [
      { kind: 'loss', on: '2026-06-10', count: 2, cause: 'other', notes: NOT_ESTABLISHED, by: TOMAS },
      { kind: 'shoots-removed', on: '2026-07-23', passNo: 1, notes: STRIPPED, by: TOMAS },
      chipBud('2026-08-19', 367, 'Yarlington Mill', 'HM-BW-26-02', 1),
      { kind: 'take-counted', on: '2026-09-16', count: 322, notes: TAKE, by: INES },
      { kind: 'loss', on: '2026-11-12', count: 3, cause: 'rodents', by: TOMAS },
    ],
  },
  {
    row: '13', from: 1, to: 450, rootstock: 'MM.106', linerGrade: '5-7mm', linedOutOn: '2026-04-16', variety: 'Kingston Black', forContract: false,
    identityChangedOn: '2026-08-25', tagPrintedOn: '2026-04-20',
    notes: 'Grown for sale, not for a contract. Lined out for Yarlington Mill; Chapel Piece had too little budwood, so it was budded with Kingston Black.',
    events: [
      { kind: 'loss', on: '2026-06-10', count: 4, cause: 'other', notes: NOT_ESTABLISHED, by: TOMAS },
      { kind: 'shoots-removed', on: '2026-07-23', passNo: 1, notes: STRIPPED, by: TOMAS },
      chipBud('2026-08-26', 446, 'Kingston Black', 'HM-BW-26-03', 1),
      { kind: 'take-counted', on: '2026-09-22', count: 389, notes: TAKE, by: INES },
      { kind: 'loss', on: '2026-11-12', count: 2, cause: 'rodents', by: TOMAS },
    ],
  },
]

const PROPAGATION_STARTED = { at: '2026-08-20T16:00:00Z', reason: 'Budded on 18 and 19 August: rows 10 to 12, the MM.106 liners lined out in April.' }

/** A day at a working hour, as the timestamp of what was done that day. */
const on = (day: string, hour = 9) => new Date(`${day}T${String(hour).padStart(2, '0')}:00:00Z`)

async function idsByName(knex: Knex, table: string, column: string, names: string[], where: Record<string, unknown> = {}): Promise<Map<string, number>> {
  const rows = await knex(table).where(where).whereIn(column, [...new Set(names)]).select('id', column) as Record<string, string | number>[]
  return new Map(rows.map(r => [String(r[column]), Number(r.id)]))
}

function lookup(map: Map<string, number>, key: string, what: string): number {
  const id = map.get(key)
  if (id === undefined) throw new Error(`Demo nursery: no ${what} named "${key}"`)
  return id
}

interface Staff { id: number, name: string }
interface Found {
  orgId: number
  people: Record<Person, Staff>
  varieties: Map<string, number>
  rootstocks: Map<string, number>
  blocks: Map<string, number>
  contract: { id: number, state: string, version: number } | null
}

/** The runs as counted from their events: a count that does not add up stops the seed. */
function checkRuns(linersWanted: number): void {
  for (const run of RUNS) {
    const linedOut = run.to - run.from + 1
    runCounts(linedOut, run.events.map((e, i) => ({ kind: e.kind, happenedOn: e.on, id: i, count: e.count ?? null, cause: e.cause ?? null })))
  }
  const forContract = RUNS.filter(r => r.forContract).reduce((s, r) => s + r.to - r.from + 1, 0)
  if (forContract !== linersWanted) throw new Error(`Demo nursery: the Dabinett runs line out ${forContract} liners, the back-plan asks for ${linersWanted}`)
}

async function insertBeds(trx: Knex.Transaction, found: Found): Promise<void> {
  const { orgId, people } = found
  for (const { records, rootstock, ...bed } of STOOL_BEDS) {
    const rootstockId = lookup(found.rootstocks, rootstock, 'rootstock')
    const [bedId] = await trx('nurseryBeds').insert({ ...bed, orgId, kind: 'stool', rootstockId, createdAt: on(records[0]!.doneOn, 8) })
    for (const { by, ...record } of records) {
      const [recordId] = await trx('nurseryBedRecords').insert({ ...record, orgId, bedId, byUserId: people[by].id, createdAt: on(record.doneOn, 17) })
      if (record.kind !== 'liners-lifted') continue
      await trx('linerLots').insert({
        orgId, rootstockId, grade: record.grade, source: 'lifted', bedRecordId: recordId, count: record.count,
        receivedOn: record.doneOn, notes: `Lifted from ${bed.name}`, createdAt: on(record.doneOn, 17),
      })
    }
  }
  for (const { rootstock, ...lot } of BOUGHT_LINERS) {
    await trx('linerLots').insert({ ...lot, orgId, rootstockId: lookup(found.rootstocks, rootstock, 'rootstock'), source: 'bought', createdAt: on(lot.receivedOn, 14) })
  }
}

async function insertBudwood(trx: Knex.Transaction, found: Found): Promise<Map<string, number>> {
  const ids = new Map<string, number>()
  for (const { variety, block, ...lot } of BUDWOOD) {
    const [id] = await trx('budwoodLots').insert({
      ...lot, orgId: found.orgId, varietyId: lookup(found.varieties, variety, 'variety'),
      blockId: block === null ? null : lookup(found.blocks, block, 'orchard block'), createdAt: on(lot.cutOn, 18),
    })
    ids.set(lot.label, id!)
  }
  return ids
}

async function insertRuns(trx: Knex.Transaction, found: Found, rows: Map<string, number>, budwood: Map<string, number>): Promise<void> {
  const { orgId, people } = found
  for (const run of RUNS) {
    const linedOutCount = run.to - run.from + 1
    const tomas = people[TOMAS]
    const [runId] = await trx('nurseryRuns').insert({
      orgId, rowId: lookup(rows, run.row, 'row'), fromPosition: run.from, toPosition: run.to,
      rootstockId: lookup(found.rootstocks, run.rootstock, 'rootstock'), linerGrade: run.linerGrade,
      linedOutOn: run.linedOutOn, linedOutCount, varietyId: lookup(found.varieties, run.variety, 'variety'),
      treeContractId: run.forContract ? found.contract?.id ?? null : null,
      tagCode: newTagCode(), tagPrintedAt: on(run.tagPrintedOn, 11), identityChangedAt: on(run.identityChangedOn ?? run.linedOutOn, 16),
      notes: run.notes, createdAt: on(run.linedOutOn, 16), updatedAt: on(run.events.at(-1)?.on ?? run.linedOutOn, 16),
    })
    await trx('propagationEvents').insert({ orgId, runId, kind: 'lined-out', happenedOn: run.linedOutOn, count: linedOutCount, byUserId: tomas.id, byName: tomas.name, createdAt: on(run.linedOutOn, 16) })
    for (const { on: day, by, variety, budwood: label, ...event } of run.events) {
      const budded = event.kind === 'budded'
      await trx('propagationEvents').insert({
        ...event, orgId, runId, happenedOn: day,
        method: budded ? 'chip-bud' : null, budHeightCm: budded ? 15 : null,
        varietyId: variety ? lookup(found.varieties, variety, 'variety') : null,
        budwoodLotId: label ? lookup(budwood, label, 'budwood lot') : null,
        byUserId: people[by].id, byName: people[by].name, createdAt: on(day, 17),
      })
    }
  }
}

/** The contract's move into propagation, as the nursery's owner made it after budding. */
async function startPropagation(trx: Knex.Transaction, found: Found): Promise<void> {
  const { contract } = found
  if (contract?.state !== 'accepted') return
  const ines = found.people[INES]
  const at = new Date(PROPAGATION_STARTED.at)
  await trx('treeContracts').where({ id: contract.id }).update({ state: 'propagating', updatedAt: at })
  await trx('contractEvents').insert({
    contractKind: 'tree', contractId: contract.id, action: 'propagation-started', version: contract.version,
    byUserId: ines.id, byOrgId: found.orgId, byName: ines.name, changes: JSON.stringify([]), terms: null, reason: PROPAGATION_STARTED.reason, at,
  })
}

async function findDabinettContract(knex: Knex, orgId: number, varieties: Map<string, number>, rootstocks: Map<string, number>) {
  const buyer = await knex('organisations').where({ name: QUILLHURST }).first('id') as { id: number } | undefined
  if (!buyer) return undefined
  const { variety, rootstock, treeCount, deliveryYear, deliverySeason } = DABINETT_CONTRACT
  const row = await knex('treeContracts')
    .where({ buyerOrgId: buyer.id, nurseryOrgId: orgId, varietyId: lookup(varieties, variety, 'variety'), rootstockId: lookup(rootstocks, rootstock, 'rootstock'), treeCount, deliveryYear, deliverySeason })
    .whereIn('state', ['accepted', 'propagating'])
    .first('id', 'state', 'version', 'treeCount', 'takeRate', 'survivalRate') as { id: number, state: string, version: number, treeCount: number, takeRate: number, survivalRate: number } | undefined
  return row
}

export async function seed(knex: Knex): Promise<void> {
  const org = await knex('organisations').where({ name: HOLLOWMERE }).first('id') as { id: number } | undefined
  if (!org) {
    console.warn('Demo nursery skipped: there is no Hollowmere Orchard & Nursery (seed the demo accounts first).')
    return
  }
  const [{ count }] = await knex('nurseryBeds').where({ orgId: org.id }).count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return
  const [{ catalogue }] = await knex('varieties').count({ catalogue: '*' }) as [{ catalogue: number }]
  if (Number(catalogue) === 0) {
    console.warn('Demo nursery skipped: the variety catalogue is empty (seed it first).')
    return
  }
  // Seeds read rows through the database edge, so in camelCase.
  const users = await knex('users').whereIn('email', [INES, TOMAS]).where({ orgId: org.id }).select('id', 'email', 'name') as (Staff & { email: Person })[]
  const blockNames = BUDWOOD.flatMap(b => (b.block ? [b.block] : []))
  const blocks = await idsByName(knex, 'orchardBlocks', 'name', blockNames, { orgId: org.id })
  if (users.length < 2 || blocks.size < new Set(blockNames).size) {
    console.warn('Demo nursery skipped: Hollowmere\'s people or orchard blocks are not all there (seed the demo accounts and blocks first).')
    return
  }
  const varieties = await idsByName(knex, 'varieties', 'name', [DABINETT_CONTRACT.variety, ...BUDWOOD.map(b => b.variety), ...RUNS.map(r => r.variety)])
  const rootstocks = await idsByName(knex, 'rootstocks', 'designation', [DABINETT_CONTRACT.rootstock, ...STOOL_BEDS.map(b => b.rootstock), ...RUNS.map(r => r.rootstock)])
  const contract = await findDabinettContract(knex, org.id, varieties, rootstocks)
  if (!contract) console.warn('Demo nursery: no accepted tree contract for 1,200 Dabinett on MM.106 from Quillhurst; the Dabinett runs are left without one.')
  const terms = contract ?? DABINETT_CONTRACT
  checkRuns(rootstocksToBud(terms.treeCount, Number(terms.takeRate), Number(terms.survivalRate)))
  const found: Found = {
    orgId: org.id,
    people: Object.fromEntries(users.map(u => [u.email, { id: u.id, name: u.name }])) as Record<Person, Staff>,
    varieties, rootstocks, blocks,
    contract: contract ? { id: contract.id, state: contract.state, version: contract.version } : null,
  }

  await knex.transaction(async (trx) => {
    await insertBeds(trx, found)
    const [fieldId] = await trx('nurseryBeds').insert({ ...FIELD, orgId: org.id, kind: 'field', createdAt: on(ROWS_MAPPED_ON) })
    const rows = new Map<string, number>()
    for (const row of ROWS) {
      const [id] = await trx('nurseryRows').insert({ ...row, orgId: org.id, fieldId, createdAt: on(ROWS_MAPPED_ON) })
      rows.set(row.name, id!)
    }
    const budwood = await insertBudwood(trx, found)
    await insertRuns(trx, found, rows, budwood)
    await startPropagation(trx, found)
  })
}
