import { z } from 'zod'
import { blankAsMissing, pageQuerySchema } from './fields'

// The queries of self-billing statements: as JSON or as a CSV to download, and the season of one
// contract or the list of the caller's seasons.

/** Harvest years a statement may name: wide enough for any contract kept, narrow enough to refuse nonsense. */
export const STATEMENT_YEARS = { min: 2000, max: 2100 } as const

const yearMessage = `Enter the harvest year, from ${STATEMENT_YEARS.min} to ${STATEMENT_YEARS.max}`
const contractMessage = 'Name the fruit contract by its id'

const format = z.preprocess(blankAsMissing, z.enum(['json', 'csv'], { message: 'Ask for json or csv' }).default('json'))
const season = z.preprocess(blankAsMissing, z.coerce.number({ message: yearMessage }).int({ message: yearMessage })
  .min(STATEMENT_YEARS.min, { message: yearMessage }).max(STATEMENT_YEARS.max, { message: yearMessage }).optional())
const contractId = z.preprocess(blankAsMissing, z.coerce.number({ message: contractMessage }).int({ message: contractMessage })
  .positive({ message: contractMessage }).optional())

/** `?format=` of one delivery's statement. */
export const statementFormatQuerySchema = z.object({ format })

/**
 * `GET /api/statements`: with `contractId` the season's statement (then `season` is needed), without
 * it the caller's seasons, `season` filtering them.
 */
export const statementQuerySchema = pageQuerySchema.extend({ format, season, contractId }).superRefine((q, ctx) => {
  if (q.contractId !== undefined && q.season === undefined) ctx.addIssue({ code: 'custom', path: ['season'], message: 'Name the harvest year of the contract\'s statement' })
  if (q.contractId === undefined && q.format === 'csv') ctx.addIssue({ code: 'custom', path: ['contractId'], message: 'Name the fruit contract whose season you download' })
})
export type StatementQuery = z.output<typeof statementQuerySchema>
