import type { Knex } from 'knex'
import { bearingRangeIssue, bearingYearsIssue, juiceClassIssue, type RootstockCreateInput, type RootstockPatchInput, type VarietyCreateInput, type VarietyPatchInput } from '#shared/schemas/catalogue'
import type { Rootstock, Variety } from '#shared/types/catalogue'
import { catalogueSpecies, deleteCatalogueRow, findCatalogueRow, insertCatalogueRow, updateCatalogueRow, type CatalogueTable } from '../repositories/catalogue'
import { ROOTSTOCKS } from '../repositories/rootstocks'
import { VARIETIES } from '../repositories/varieties'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals, type DbRefusal } from '../utils/db'
import { fieldError, notFound } from '../utils/validation'

// Writes to the shared catalogue, each one transaction with its audit entry. Only the platform
// admin calls these (the routes check); the names are unique ignoring case, so a clash is a 409.

const TAKEN: Record<CatalogueTable['table'], (name: unknown) => string> = {
  varieties: name => `A variety named "${String(name)}" is already in the catalogue`,
  rootstocks: designation => `A rootstock designated "${String(designation)}" is already in the catalogue`,
}

function duplicateOf(t: CatalogueTable, input: Record<string, unknown>): DbRefusal {
  return { field: t.nameField, message: TAKEN[t.table](input[t.nameField]) }
}

function changedFields(patch: Record<string, unknown>): string[] {
  return Object.keys(patch).filter(k => patch[k] !== undefined)
}

function createEntry<Item>(t: CatalogueTable, actorId: number, input: Record<string, unknown>): Promise<Item> {
  return withDbRefusals({ duplicate: duplicateOf(t, input) }, () => useDb().transaction(async (trx) => {
    const id = await insertCatalogueRow(trx, t, input)
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: `${t.noun}.created`, objectType: t.noun, objectId: id, detail: { [t.nameField]: input[t.nameField] } })
    return (await findCatalogueRow<Item>(trx, t, id))!
  }))
}

/** Saves the given fields; `check` sees the stored entry (locked until the save commits) and may refuse. */
function updateEntry<Item extends Record<string, unknown>>(
  t: CatalogueTable, actorId: number, id: number, patch: Record<string, unknown>, check?: (current: Item) => void,
): Promise<Item> {
  return withDbRefusals({ duplicate: duplicateOf(t, patch) }, () => useDb().transaction(async (trx) => {
    const current = await findCatalogueRow<Item>(trx, t, id, { lock: true })
    if (!current) notFound(`That ${t.noun}`)
    check?.(current)
    await updateCatalogueRow(trx, t, id, patch)
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: `${t.noun}.updated`, objectType: t.noun, objectId: id, detail: { [t.nameField]: current[t.nameField], changed: changedFields(patch) } })
    return (await findCatalogueRow<Item>(trx, t, id))!
  }))
}

/** An entry still named by blocks, nursery rows or contracts stays (409, saying why). */
async function deleteEntry(t: CatalogueTable, actorId: number, id: number): Promise<void> {
  let name = `This ${t.noun}`
  const inUse = { message: () => `${name} is named by orchard blocks or other records, so it cannot be deleted. Correct its details instead.` }
  await withDbRefusals({ inUse }, () => useDb().transaction(async (trx) => {
    const row = await findCatalogueRow<Record<string, string>>(trx, t, id, { lock: true })
    if (!row) notFound(`That ${t.noun}`)
    name = row[t.nameField]!
    await deleteCatalogueRow(trx, t, id)
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: `${t.noun}.deleted`, objectType: t.noun, objectId: id, detail: { [t.nameField]: name } })
  }))
}

export const createVariety = (actorId: number, input: VarietyCreateInput) => createEntry<Variety>(VARIETIES, actorId, input)
export function updateVariety(actorId: number, id: number, patch: VarietyPatchInput): Promise<Variety> {
  return updateEntry<Variety & Record<string, unknown>>(VARIETIES, actorId, id, patch, (current) => {
    // Changing the species or the class alone must still leave a class that species has.
    const issue = juiceClassIssue(patch.species ?? current.species, patch.juiceClass ?? current.juiceClass)
    if (issue) throw fieldError([{ path: 'juiceClass', message: issue }])
  })
}
export const deleteVariety = (actorId: number, id: number) => deleteEntry(VARIETIES, actorId, id)

export const createRootstock = (actorId: number, input: RootstockCreateInput) => createEntry<Rootstock>(ROOTSTOCKS, actorId, input)
export const deleteRootstock = (actorId: number, id: number) => deleteEntry(ROOTSTOCKS, actorId, id)

export function updateRootstock(actorId: number, id: number, patch: RootstockPatchInput): Promise<Rootstock> {
  return updateEntry<Rootstock & Record<string, unknown>>(ROOTSTOCKS, actorId, id, patch, (current) => {
    // A patch of one bearing figure must still agree with the stored other one.
    const after = <K extends keyof Rootstock>(key: K) => (patch[key as keyof RootstockPatchInput] !== undefined ? patch[key as keyof RootstockPatchInput] : current[key]) as Rootstock[K]
    const issue = bearingYearsIssue(after('yearsToFirstCrop'), after('yearsToFullBearing'))
    if (issue) throw fieldError([{ path: patch.yearsToFullBearing !== undefined ? 'yearsToFullBearing' : 'yearsToFirstCrop', message: issue }])
    const range = bearingRangeIssue(after('yearsToFirstCrop'), after('yearsToFirstCropLate'))
    if (range) throw fieldError([{ path: patch.yearsToFirstCropLate !== undefined ? 'yearsToFirstCropLate' : 'yearsToFirstCrop', message: range }])
  })
}

/** The variety and rootstock must be in the catalogue and of the same species (a pear on a pear stock). */
export async function checkCatalogue(trx: Knex.Transaction, varietyId: number, rootstockId: number): Promise<void> {
  const [variety, rootstock] = await catalogueSpecies(trx, varietyId, rootstockId)
  if (!variety) throw fieldError([{ path: 'varietyId', message: 'No variety with that id is in the catalogue' }])
  if (!rootstock) throw fieldError([{ path: 'rootstockId', message: 'No rootstock with that id is in the catalogue' }])
  if (variety.species !== rootstock.species) {
    const a = (s: string) => (s === 'apple' ? 'an apple' : 'a pear')
    throw fieldError([{ path: 'rootstockId', message: `${variety.name} is ${a(variety.species)}: choose ${a(variety.species)} rootstock (${rootstock.designation} is for ${rootstock.species}s)` }])
  }
}
