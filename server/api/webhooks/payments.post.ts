import { verifiedProcessorEvent } from '../../utils/paymentWebhook'
import { handleProcessorEvent } from '../../services/payments'

// The processor's events. No session: the signature over the raw body is the caller's proof, and
// an unsigned or badly signed call answers 400 before anything is read or changed.
export default defineEventHandler(async (event) => {
  const processorEvent = await verifiedProcessorEvent(event)
  const { handled, applied } = await handleProcessorEvent(processorEvent)
  return { received: true, handled, applied }
})
