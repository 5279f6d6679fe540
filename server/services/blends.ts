import type { BlendLotListQuery, BlendSolveInput } from '#shared/schemas/blend'
import type { BlendCandidateLot, BlendLotReading, BlendSolveResponse, SolverLot, SolverResult } from '#shared/types/blend'
import { potentialAbv } from '#shared/utils/alcohol'
import { settleLoad } from '#shared/utils/deliverySettlement'
import { juiceClass } from '#shared/utils/juiceClass'
import { brixToSg, sgToBrix } from '#shared/utils/sugar'
import { blendLotRowsByIds, listBlendLotRows, makerSettings, type BlendLotRow } from '../repositories/blends'
import { latestReadingRows, type ReadingRow } from '../repositories/lots'
import { BlendInputError, BlendSolverError, solveBlend } from '../utils/blendSolver'
import { useDb, type Db } from '../utils/db'
import { fieldError } from '../utils/validation'

// The blend planner: the lots a maker may blend, each priced by its fruit contract's sugar terms on
// its latest reading (the settlement module, as a delivery of it would be paid), and the least-cost
// blend of the lots chosen, worked by the HiGHS solver in server/utils/blendSolver.ts.

interface Priced {
  reading: BlendLotReading | null
  /** °Brix of the latest reading, from its SG when it has no °Brix; null without either. */
  brix: number | null
  pricePerTonne: number | null
  rejected: boolean
  rejectReason: string | null
}

function readingOf(row: ReadingRow | undefined): BlendLotReading | null {
  if (!row) return null
  return { brix: row.brix, sg: row.sg, taGPerL: row.taGPerL, tanninGPerL: row.tanninGPerL, ph: row.ph, testedOn: row.sampledOn }
}

/**
 * A lot's price per tonne: its contract's base price adjusted for the latest °Brix by the contract's
 * terms, the same arithmetic a delivery of it is settled by. Under the reject floor, or under a
 * contract in another currency than the maker's, it is left out of a solve unless a price is typed.
 */
function priced(lot: BlendLotRow, latest: ReadingRow | undefined, makerCurrency: string): Priced {
  const reading = readingOf(latest)
  const brix = reading?.brix ?? (reading?.sg != null ? sgToBrix(reading.sg) : null)
  if (brix === null) return { reading, brix, pricePerTonne: null, rejected: false, rejectReason: null }
  const { settlement } = settleLoad(lot.terms, { netKg: 1000, brix }, null)
  const pricePerTonne = Math.max(0, Math.round(settlement.pricePerTonneMinor))
  const below = settlement.rejectReasons.includes('below-floor')
  if (below) return { reading, brix, pricePerTonne, rejected: true, rejectReason: settlement.rejectedBecause[0]! }
  if (lot.currency !== makerCurrency) {
    return { reading, brix, pricePerTonne, rejected: true, rejectReason: `Its contract is priced in ${lot.currency}, not ${makerCurrency}; type a price to include it` }
  }
  return { reading, brix, pricePerTonne, rejected: false, rejectReason: null }
}

function candidate(lot: BlendLotRow, price: Priced, juiceYieldLPerTonne: number | null): BlendCandidateLot {
  const { terms: _terms, state, ...rest } = lot
  return {
    ...rest,
    state: state === 'pressed' ? 'delivered' : state,
    reading: price.reading,
    pricePerTonne: price.pricePerTonne,
    rejected: price.rejected,
    rejectReason: price.rejectReason,
    juiceYieldLPerTonne,
  }
}

async function settingsOf(orgId: number, db: Db = useDb()) {
  const settings = await makerSettings(db, orgId)
  return { currency: settings?.currency ?? 'GBP', juiceYield: settings?.defaultJuiceYieldLPerT ?? null }
}

export async function listBlendLots(orgId: number, query: BlendLotListQuery): Promise<{ items: BlendCandidateLot[], total: number }> {
  const db = useDb()
  const [settings, { rows, total }] = await Promise.all([settingsOf(orgId), listBlendLotRows(db, orgId, query)])
  const latest = await latestReadingRows(db, rows.map(r => r.lotId))
  return { items: rows.map(r => candidate(r, priced(r, latest.get(r.lotId), settings.currency), settings.juiceYield)), total }
}

// ----- Solving -----

/** What the answer shows of each lot given to the solver, by the solver's key. */
interface LineLot { lotId?: number, code: string, freeKg: number, pricePerTonne: number, index: number }

type Rejected = BlendSolveResponse['rejected'][number]

/** The real lots of a solve, each as the solver takes it, or left out with the reason. */
async function realLots(orgId: number, input: BlendSolveInput, db: Db) {
  const wanted = input.lots.flatMap((lot, index) => ('lotId' in lot ? [{ lot, index }] : []))
  const ids = wanted.map(w => w.lot.lotId)
  // Three reads that do not wait on each other; the readings are used only for the lots found.
  const [settings, found, latest] = await Promise.all([settingsOf(orgId, db), blendLotRowsByIds(db, orgId, ids), latestReadingRows(db, ids)])
  const { currency, juiceYield } = settings
  const rows = new Map(found.map(r => [r.lotId, r]))
  const unseen = ids.filter(id => !rows.has(id))
  if (unseen.length) throw createError({ statusCode: 404, message: `Lot${unseen.length === 1 ? '' : 's'} ${unseen.join(', ')} ${unseen.length === 1 ? 'was' : 'were'} not found.` })
  const solverLots: { solver: SolverLot, line: LineLot }[] = []
  const rejected: Rejected[] = []
  for (const { lot, index } of wanted) {
    const row = rows.get(lot.lotId)!
    const leftOut = (reason: string) => rejected.push({ lotId: row.lotId, code: row.code, reason })
    const price = priced(row, latest.get(row.lotId), currency)
    if (row.state === 'pressed') leftOut('Pressed already')
    else if (row.freeKg <= 0) leftOut('None of it is free')
    else if (price.brix === null || price.reading === null) leftOut('No juice reading with °Brix or SG yet')
    else if (price.rejected && lot.pricePerTonne === undefined) leftOut(price.rejectReason!)
    else {
      const yieldLPerTonne = lot.juiceYieldLPerTonne ?? juiceYield
      if (yieldLPerTonne === null) {
        throw fieldError([{ path: `lots.${index}.juiceYieldLPerTonne`, message: 'Set your press\'s juice yield in the settings, or give one for this lot' }])
      }
      const pricePerTonne = lot.pricePerTonne ?? price.pricePerTonne!
      solverLots.push({
        solver: {
          key: `lot:${row.lotId}`, availableKg: row.freeKg, juiceYieldLPerTonne: yieldLPerTonne, brix: price.brix,
          sg: price.reading.sg ?? brixToSg(price.brix), taGPerL: price.reading.taGPerL, tanninGPerL: price.reading.tanninGPerL, ph: price.reading.ph,
          costPerTonneMinor: pricePerTonne + (lot.haulagePerTonne ?? 0), varietyId: row.varietyId, juiceClass: row.juiceClass,
        },
        line: { lotId: row.lotId, code: row.code, freeKg: row.freeKg, pricePerTonne, index },
      })
    }
  }
  return { solverLots, rejected, settings }
}

/** A what-if lot as the solver takes it: its class from its acid and tannin by the apple thresholds. */
function whatIfLots(input: BlendSolveInput): { solver: SolverLot, line: LineLot }[] {
  return input.lots.flatMap((lot, index) => ('lotId' in lot
    ? []
    : [{
        solver: {
          key: `what-if:${lot.code}`, availableKg: lot.availableKg, juiceYieldLPerTonne: lot.juiceYieldLPerTonne, brix: lot.brix, sg: brixToSg(lot.brix),
          taGPerL: lot.taGPerL, tanninGPerL: lot.tanninGPerL, ph: null, costPerTonneMinor: lot.pricePerTonne, varietyId: null,
          juiceClass: juiceClass(lot.taGPerL, lot.tanninGPerL),
        },
        line: { code: lot.code, freeKg: lot.availableKg, pricePerTonne: lot.pricePerTonne, index },
      }]))
}

/** The solver's answer, a bad figure it found named by the request's own path, and never a 500. */
async function solved(input: BlendSolveInput, lots: { solver: SolverLot, line: LineLot }[]): Promise<SolverResult> {
  try {
    return await solveBlend({ target: input.target, volumeL: input.volumeL, lots: lots.map(l => l.solver), shares: input.shares })
  }
  catch (error) {
    if (error instanceof BlendInputError) {
      const [first, at, ...rest] = error.path
      const path = first === 'lots' && typeof at === 'number' ? ['lots', lots[at]!.line.index, ...rest] : error.path
      throw fieldError([{ path: path.join('.'), message: error.message }])
    }
    if (error instanceof BlendSolverError) throw createError({ statusCode: 422, message: 'The solver could not work this blend out; change the ranges or the lots and solve again.' })
    throw error
  }
}

/**
 * The least-cost blend of the lots chosen, each with what is free of it now. A plan's commit passes
 * its transaction, with the lots locked, so the free kilograms it solves on hold until it reserves;
 * everything is then read on that connection, so a transaction that waited for the lots' locks never
 * needs a second connection from the pool to finish.
 */
export async function solveBlendFor(orgId: number, input: BlendSolveInput, db: Db = useDb()): Promise<BlendSolveResponse> {
  const real = await realLots(orgId, input, db)
  const { settings } = real
  const lots = [...real.solverLots, ...whatIfLots(input)].sort((a, b) => a.line.index - b.line.index)
  const rejected = real.rejected
  if (!lots.length) {
    // Every lot chosen was left out: nothing to blend, so the nearest mix is no juice at all.
    return {
      status: 'nearest', lines: [], predicted: null, cost: 0, costPerLitre: 0, currency: settings.currency,
      misses: [{ property: 'volumeL', min: input.volumeL, max: input.volumeL, achieved: 0 }], binding: [], rejected,
    }
  }
  const result = await solved(input, lots)
  const byKey = new Map(lots.map(l => [l.solver.key, l.line]))
  for (const excluded of result.excluded ?? []) {
    // Only a real lot can lack a reading a range needs: a what-if lot gives every figure.
    const line = byKey.get(excluded.key)!
    if (line.lotId !== undefined) rejected.push({ lotId: line.lotId, code: line.code, reason: excluded.reason })
  }
  return {
    status: result.status,
    lines: result.lines.map(({ key, kg, litres, share }) => {
      const { lotId, code, freeKg, pricePerTonne } = byKey.get(key)!
      return lotId === undefined ? { code, kg, litres, share, freeKg, pricePerTonne } : { lotId, code, kg, litres, share, freeKg, pricePerTonne }
    }),
    predicted: result.predicted && { ...result.predicted, potentialAbv: potentialAbv(result.predicted, input.alcoholMethod) },
    cost: result.costMinor,
    costPerLitre: result.costPerLitreMinor,
    currency: settings.currency,
    misses: result.misses,
    binding: result.binding,
    rejected,
  }
}
