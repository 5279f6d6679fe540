import { z } from 'zod'
import { blankAsMissing, isoDate, pageQuerySchema } from './fields'

// The season calendar's query: which tasks (open, overdue, done or all), due in a span of days,
// of one contract or one run, a page at a time.

export const TASK_STATES = ['open', 'overdue', 'done', 'all'] as const
export type TaskState = typeof TASK_STATES[number]

const id = (what: string) => z.coerce.number({ message: `Not a valid ${what} id` }).int({ message: `Not a valid ${what} id` }).positive({ message: `Not a valid ${what} id` })

export const taskListQuerySchema = pageQuerySchema.extend({
  state: z.preprocess(blankAsMissing, z.enum(TASK_STATES, { message: 'Choose open, overdue, done or all' }).default('all')),
  from: z.preprocess(blankAsMissing, isoDate('Enter the first due date as YYYY-MM-DD').optional()),
  to: z.preprocess(blankAsMissing, isoDate('Enter the last due date as YYYY-MM-DD').optional()),
  treeContractId: z.preprocess(blankAsMissing, id('contract').optional()),
  runId: z.preprocess(blankAsMissing, id('run').optional()),
}).superRefine((q, ctx) => {
  if (q.from && q.to && q.to < q.from) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last due date must be on or after the first' })
})
export type TaskListQuery = z.output<typeof taskListQuerySchema>
