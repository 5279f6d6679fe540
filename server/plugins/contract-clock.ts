import { runContractClock } from '../services/contractClock'

// Expired offers and fulfilled fruit contracts are recorded in the background, every
// POMEWRIGHT_CONTRACT_CLOCK_MS (a minute unless set; 0 turns it off). A failed round is logged and
// the next one tries again.
export default defineNitroPlugin((nitroApp) => {
  const raw = process.env.POMEWRIGHT_CONTRACT_CLOCK_MS
  const intervalMs = raw === undefined || raw === '' ? 60_000 : Number(raw)
  if (!Number.isInteger(intervalMs) || intervalMs < 0) throw new Error(`POMEWRIGHT_CONTRACT_CLOCK_MS must be a whole number of milliseconds, got "${raw}"`)
  if (intervalMs === 0) return
  let running = false
  const timer = setInterval(() => {
    if (running) return
    running = true
    runContractClock()
      .catch(error => console.error('contract clock:', error instanceof Error ? error.message : error))
      .finally(() => { running = false })
  }, intervalMs)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
