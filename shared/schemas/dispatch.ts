import { z } from 'zod'
import { BUNDLE_SIZE_LIMITS, DEFAULT_BUNDLE_SIZE } from '../utils/plantPassport'
import { blankAsMissing } from './fields'

// The dispatch labels' query: how many trees a bundle holds, and one run of the contract alone.

const bundleMessage = `Enter the trees to a bundle as a whole number from ${BUNDLE_SIZE_LIMITS.min} to ${BUNDLE_SIZE_LIMITS.max}`
const runMessage = 'Choose a run by its id'

export const dispatchLabelsQuerySchema = z.object({
  bundleSize: z.preprocess(blankAsMissing, z.coerce.number({ message: bundleMessage }).int({ message: bundleMessage })
    .min(BUNDLE_SIZE_LIMITS.min, { message: bundleMessage }).max(BUNDLE_SIZE_LIMITS.max, { message: bundleMessage }).optional())
    .transform(v => v ?? DEFAULT_BUNDLE_SIZE),
  runId: z.preprocess(blankAsMissing, z.coerce.number({ message: runMessage }).int({ message: runMessage }).positive({ message: runMessage }).optional()),
})
export type DispatchLabelsQuery = z.output<typeof dispatchLabelsQuerySchema>
