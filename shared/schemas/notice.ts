import { z } from 'zod'
import { MESSAGE_STATES } from '../utils/messageStatus'
import { pageQuerySchema } from './fields'

export const noticeListQuerySchema = pageQuerySchema

/** The owners' view of the outbox: newest first, optionally one state only. */
export const outboxQuerySchema = pageQuerySchema.extend({
  status: z.enum(MESSAGE_STATES, { message: `Choose one of ${MESSAGE_STATES.join(', ')}` }).optional(),
})
