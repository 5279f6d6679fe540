import type { BUDWOOD_SOURCES } from '../schemas/nursery'
import type { RuleIssue } from './bedRules'

// Where a lot of budwood came from decides what it must say: a tree sold under the wrong name is
// found out only when it fruits, and a fire-blight outbreak in a nursery has been traced to
// symptomless budwood (Smith 2002, Acta Horticulturae 590:109), so each lot names its source.

export type BudwoodSource = typeof BUDWOOD_SOURCES[number]
export type BudwoodField = 'blockId' | 'sourceNote' | 'supplier' | 'certificate'
export const BUDWOOD_FIELDS: readonly BudwoodField[] = ['blockId', 'sourceNote', 'supplier', 'certificate']

export const BUDWOOD_SOURCE_LABELS: Record<BudwoodSource, string> = {
  'own-block': 'One of our orchard blocks',
  'own-tree': 'One of our own trees',
  'bought': 'Bought in',
}

/**
 * What each source must name and what it may. A block says which block (the tree or row within it
 * may be noted); a single tree is written down, since no block names it; bought-in wood names its
 * supplier and the plant-health certificate or passport it came with. A certificate may go with
 * the nursery's own wood too, where a scheme certifies its mother trees.
 */
export const BUDWOOD_FIELDS_BY_SOURCE: Record<BudwoodSource, { required: readonly BudwoodField[], optional: readonly BudwoodField[] }> = {
  'own-block': { required: ['blockId'], optional: ['sourceNote', 'certificate'] },
  'own-tree': { required: ['sourceNote'], optional: ['certificate'] },
  'bought': { required: ['supplier', 'certificate'], optional: ['sourceNote'] },
}

const NEEDED: Record<BudwoodField, string> = {
  blockId: 'Choose the block the wood was cut from',
  sourceNote: 'Say which tree the wood was cut from',
  supplier: 'Enter the supplier',
  certificate: 'Enter the plant-health certificate or passport number',
}

const WOOD_FROM: Record<BudwoodSource, string> = {
  'own-block': 'Wood from an orchard block',
  'own-tree': 'Wood from a single tree',
  'bought': 'Bought-in wood',
}

const NAMES: Record<BudwoodField, string> = {
  blockId: 'block',
  sourceNote: 'source note',
  supplier: 'supplier',
  certificate: 'certificate',
}

export function budwoodFieldApplies(source: BudwoodSource, field: BudwoodField): boolean {
  const { required, optional } = BUDWOOD_FIELDS_BY_SOURCE[source]
  return required.includes(field) || optional.includes(field)
}

/** Each field the source needs that is empty, and each field given that the source does not have. */
export function budwoodFieldIssues(source: BudwoodSource, values: Partial<Record<BudwoodField, unknown>>): RuleIssue[] {
  const issues: RuleIssue[] = []
  for (const field of BUDWOOD_FIELDS) {
    const given = values[field] !== null && values[field] !== undefined
    if (BUDWOOD_FIELDS_BY_SOURCE[source].required.includes(field) && !given) issues.push({ path: field, message: NEEDED[field] })
    else if (!budwoodFieldApplies(source, field) && given) {
      issues.push({ path: field, message: `${WOOD_FROM[source]} has no ${NAMES[field]}: leave it empty` })
    }
  }
  return issues
}
