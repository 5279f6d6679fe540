import Stripe from 'stripe'

// The payment processor through its own SDK. PAYMENTS_API_URL says where its API is: the local fake
// (`http://127.0.0.1:12111`) by default, or the real service (`https://api.stripe.com`) with real
// keys in STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET; nothing else changes between the two.

let client: Stripe | undefined

export function useProcessor(): Stripe {
  if (!client) {
    const url = new URL(process.env.PAYMENTS_API_URL || 'http://127.0.0.1:12111')
    const protocol = url.protocol === 'http:' ? 'http' : 'https'
    client = new Stripe(process.env.STRIPE_SECRET_KEY || 'sk_test_pomewright_local', {
      host: url.hostname,
      port: url.port || (protocol === 'http' ? 80 : 443),
      protocol,
      // Every call carries an idempotency key of our own, so a retry never charges twice.
      maxNetworkRetries: 2,
      timeout: 20_000,
    })
  }
  return client
}

export const webhookSecret = () => process.env.STRIPE_WEBHOOK_SECRET || 'whsec_pomewright_local'

/**
 * A failed call to the processor as an answer a person can act on: 503 when it does not answer,
 * 502 when it refuses (its own message is kept); never a bare 500.
 */
export function processorError(error: unknown): Error {
  if (error instanceof Stripe.errors.StripeConnectionError || error instanceof Stripe.errors.StripeAPIError) {
    return createError({ statusCode: 503, message: 'The payment processor is not answering. Nothing was charged; try again in a minute.' })
  }
  if (error instanceof Stripe.errors.StripeError) {
    return createError({ statusCode: 502, message: `The payment processor refused the request: ${error.message}`, data: { processor: { type: error.type, param: error.param ?? null } } })
  }
  return error as Error
}

/** Runs one call to the processor, turning its failures into answers. */
export async function withProcessor<T>(call: (stripe: Stripe) => Promise<T>): Promise<T> {
  try {
    return await call(useProcessor())
  }
  catch (error) {
    throw processorError(error)
  }
}
