import type { H3Event } from 'h3'
import type Stripe from 'stripe'
import { useProcessor, webhookSecret } from './paymentProcessor'

/**
 * The processor's event, verified by its signature on the exact bytes sent (`stripe.webhooks.
 * constructEvent`); a missing or wrong signature, or a body that is not an event, is a 400.
 */
export async function verifiedProcessorEvent(event: H3Event): Promise<Stripe.Event> {
  const signature = getRequestHeader(event, 'stripe-signature')
  if (!signature) throw createError({ statusCode: 400, message: 'The Stripe-Signature header is missing: only the payment processor sends events here.' })
  const raw = (await readRawBody(event, false)) ?? Buffer.alloc(0)
  try {
    return useProcessor().webhooks.constructEvent(raw, signature, webhookSecret())
  }
  catch (error) {
    throw createError({ statusCode: 400, message: `The event's signature does not verify: ${(error as Error).message}` })
  }
}
