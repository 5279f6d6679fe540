import { startOutboxSender } from '../services/outboxSender'
import { outboxSettings } from '../utils/outboxSettings'

// Every app instance sends the outbox's e-mail in the background, unless POMEWRIGHT_OUTBOX_SENDER=off;
// the claim on each row keeps two instances from sending one message. Stops with the server.
export default defineNitroPlugin((nitroApp) => {
  const settings = outboxSettings()
  if (!settings.enabled) return
  const sender = startOutboxSender(settings)
  nitroApp.hooks.hook('close', () => sender.stop())
})
