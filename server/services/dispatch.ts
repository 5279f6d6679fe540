import type { DispatchLabelsQuery } from '#shared/schemas/dispatch'
import type { PropagationEvent } from '#shared/types/nursery'
import type { DispatchGradeTotal, DispatchLabel, DispatchLabelSheet } from '#shared/types/dispatch'
import type { TreeContractState } from '#shared/utils/contractStatus'
import { deliveryInWords, gradeInWords, passportFields, passportIssuer, splitIntoBundles, traceabilityCode, type PassportIssuer } from '#shared/utils/plantPassport'
import { speciesOfVarieties } from '../repositories/dispatch'
import { eventsOfRuns, listRunRows, type RunRow } from '../repositories/nurseryRuns'
import { findSettings } from '../repositories/organisations'
import { findTreeContract, type TreeContractRow } from '../repositories/treeContracts'
import { useDb } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'

// Dispatch labels for the trees dug from a tree contract's runs: one label per bundle, with the
// plant passport where the nursery is registered for one. Only the contract's nursery prints them;
// the buyer is told so (403), anyone else finds no contract (404). Nothing is written.

/** Trees are dug and dispatched once the contract is under way; before that there is nothing to tie. */
const LABEL_STATES: TreeContractState[] = ['propagating', 'ready', 'delivered']

/** The variety a run's trees carry: the last one budded or grafted on it, else the one it is meant for. */
function workedVariety(run: RunRow, events: PropagationEvent[]): { id: number, name: string } {
  const worked = events.filter(e => (e.kind === 'budded' || e.kind === 'grafted') && e.varietyId !== null).at(-1)
  return worked ? { id: worked.varietyId!, name: worked.varietyName ?? run.varietyName } : { id: run.varietyId, name: run.varietyName }
}

interface RunLabels { labels: DispatchLabel[], warning: string | null }

function labelsOfRun(contract: TreeContractRow, run: RunRow, events: PropagationEvent[], species: DispatchLabel['species'], issuer: PassportIssuer, bundleSize: number): RunLabels {
  const variety = workedVariety(run, events)
  const common = {
    runId: run.id, fieldName: run.fieldName, rowName: run.rowName, fromPosition: run.fromPosition, toPosition: run.toPosition,
    varietyName: variety.name, species, rootstockDesignation: run.rootstockDesignation, interstem: run.interstem,
    contractId: contract.id, buyerName: contract.buyerOrgName, delivery: deliveryInWords(contract.deliveryYear, contract.deliverySeason),
  }
  const labels: DispatchLabel[] = []
  for (const dig of events.filter(e => e.kind === 'dug')) {
    for (const { count: trees, ...grade } of dig.grades ?? []) {
      for (const count of splitIntoBundles(trees, bundleSize)) {
        const bundleNo = labels.length + 1
        const code = traceabilityCode(run.tagCode, bundleNo)
        labels.push({
          ...common, code, bundleNo, count, grade, gradeWords: gradeInWords(grade), dugOn: dig.happenedOn,
          underCaliper: contract.minCaliperMm !== null && grade.caliperMm < contract.minCaliperMm,
          passport: passportFields(issuer, species, code),
        })
      }
    }
  }
  const warning = labels.length && variety.id !== contract.varietyId
    ? `Row ${run.rowName} (${run.fromPosition}–${run.toPosition}) was worked with ${variety.name}, not the ${contract.varietyName} the contract orders: its labels say ${variety.name}.`
    : null
  return { labels, warning }
}

function totalsOf(labels: DispatchLabel[]): DispatchLabelSheet['totals'] {
  const grades = new Map<string, DispatchGradeTotal>()
  for (const label of labels) {
    const total = grades.get(label.gradeWords) ?? { gradeWords: label.gradeWords, underCaliper: label.underCaliper, trees: 0, bundles: 0 }
    total.trees += label.count
    total.bundles += 1
    grades.set(label.gradeWords, total)
  }
  return { trees: labels.reduce((s, l) => s + l.count, 0), bundles: labels.length, grades: [...grades.values()] }
}

export async function dispatchLabels(user: { orgId: number }, contractId: number, query: DispatchLabelsQuery): Promise<DispatchLabelSheet> {
  const db = useDb()
  const contract = await findTreeContract(db, user.orgId, contractId)
  if (!contract) notFound('That tree contract')
  if (contract.nurseryOrgId !== user.orgId) {
    throw createError({ statusCode: 403, message: `Dispatch labels are printed by the nursery, ${contract.nurseryOrgName}: ask it for them.` })
  }
  if (!LABEL_STATES.includes(contract.state)) {
    throw createError({ statusCode: 409, message: `This contract is ${contract.state}: dispatch labels are printed for trees dug once a contract is in propagation, ready or delivered.`, data: { state: contract.state } })
  }
  const { rows: runs } = await listRunRows(db, user.orgId, { treeContractId: contractId, limit: 0, offset: 0, hasWarnings: undefined })
  const chosen = query.runId === undefined ? runs : runs.filter(r => r.id === query.runId)
  if (!chosen.length && query.runId !== undefined) throw fieldError([{ path: 'runId', message: 'No run serving this contract has that id' }])

  const [events, settings] = await Promise.all([eventsOfRuns(db, user.orgId, chosen.map(r => r.id)), findSettings(db, user.orgId)])
  const eventsOf = (run: RunRow) => events.filter(e => e.runId === run.id)
  const species = await speciesOfVarieties(db, [contract.varietyId, ...chosen.map(run => workedVariety(run, eventsOf(run)).id)])
  const issuer = passportIssuer({ plantHealthRegNo: settings?.plantHealthRegNo, countryCode: settings?.countryCode })
  const perRun = chosen.map(run => labelsOfRun(contract, run, eventsOf(run), species.get(workedVariety(run, eventsOf(run)).id) ?? contract.varietySpecies, issuer, query.bundleSize))
  const labels = perRun.flatMap(r => r.labels)
  const warnings = perRun.flatMap(r => (r.warning ? [r.warning] : []))
  if (!labels.length) warnings.push('No trees have been dug from this contract\'s runs yet: record the dig on each run, by grade, and the labels follow.')

  return {
    contract: {
      id: contract.id, state: contract.state, buyerName: contract.buyerOrgName, nurseryName: contract.nurseryOrgName, varietyName: contract.varietyName,
      rootstockDesignation: contract.rootstockDesignation, interstem: contract.interstem, treeCount: contract.treeCount, minCaliperMm: contract.minCaliperMm,
      delivery: deliveryInWords(contract.deliveryYear, contract.deliverySeason),
    },
    bundleSize: query.bundleSize,
    runId: query.runId ?? null,
    runs: runs.map(r => ({ id: r.id, fieldName: r.fieldName, rowName: r.rowName, fromPosition: r.fromPosition, toPosition: r.toPosition })),
    passportNote: issuer.ok ? null : issuer.note,
    warnings,
    labels,
    totals: totalsOf(labels),
  }
}
