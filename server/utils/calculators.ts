import type { AcidQuery, PlantingQuery, SugarQuery } from '#shared/schemas/calc'
import type { AcidResult, SugarResult } from '#shared/types/calc'
import { convertAcid, taFromTitration } from '#shared/utils/acid'
import { potentialAbv } from '#shared/utils/alcohol'
import type { SpacingUnit } from '#shared/utils/planting'
import { apparentToTrueSg, brixToSg, sgToBrix, sgToPlato, solubleSolidsGPerL, sugarEstimate } from '#shared/utils/sugar'
import { fieldError } from './validation'

/**
 * Runs arithmetic from the pure modules on a caller's input. The modules throw RangeError for a value
 * they cannot work with; that is the caller's input at fault, so it answers 400 naming the fields
 * (the same shape as a schema miss) instead of 500.
 */
export function calculateFor<T>(fields: readonly string[], compute: () => T): T {
  try {
    return compute()
  }
  catch (error) {
    if (!(error instanceof RangeError)) throw error
    throw fieldError(fields.map(path => ({ path, message: error.message })), { message: `${fields.join(', ')}: ${error.message}` })
  }
}

/**
 * Everything about a juice's sugar from °Brix or from its apparent SG 20/20 °C. Potential alcohol is
 * the drop from this gravity to 1.000 by a gravity method, or its sugar g/L (OIV refractometry
 * table) ÷ 16.83 (OIV).
 */
export function sugarReading(query: SugarQuery): SugarResult {
  // The schema lets exactly one of the two through; NaN would only reach the modules' own refusal.
  const brix = query.brix ?? sgToBrix(query.sg ?? Number.NaN)
  const sgApparent = query.sg ?? brixToSg(brix)
  const sugar = sugarEstimate(brix)
  return {
    brix,
    sgApparent,
    sgTrue: apparentToTrueSg(sgApparent),
    plato: sgToPlato(sgApparent),
    solubleSolidsGPerL: solubleSolidsGPerL(brix),
    sugarGPerL: sugar.gPerL,
    sugarExtrapolated: sugar.extrapolated,
    potentialAbv: potentialAbv({ brix, sg: sgApparent }, query.method),
    method: query.method,
  }
}

/** Titratable acidity as malic, tartaric and sulfuric, from a figure or from a titration. */
export function acidity(query: AcidQuery): AcidResult {
  if (query.value !== undefined) return convertAcid(query.value, query.as)
  // The schema makes the titration complete; NaN would only reach taFromTitration's own refusal.
  const { naohMl = Number.NaN, normality = Number.NaN, sampleMl = Number.NaN, as } = query
  return convertAcid(taFromTitration({ naohMl, normality, sampleMl, as }), as)
}

export interface PlantingSpacing { inRow: number, betweenRow: number, unit: SpacingUnit, fields: [inRow: string, betweenRow: string] }

/** The spacing pair a planting query gives, in the unit it came in, with the names of its fields. */
export function plantingSpacing(query: PlantingQuery): PlantingSpacing {
  // The schema lets one complete pair through; NaN would only reach plantingDensity's own refusal.
  if (query.inRowFt !== undefined || query.betweenRowFt !== undefined) {
    return { inRow: query.inRowFt ?? Number.NaN, betweenRow: query.betweenRowFt ?? Number.NaN, unit: 'ft', fields: ['inRowFt', 'betweenRowFt'] }
  }
  return { inRow: query.inRowM ?? Number.NaN, betweenRow: query.betweenRowM ?? Number.NaN, unit: 'm', fields: ['inRowM', 'betweenRowM'] }
}
