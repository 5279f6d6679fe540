import type { ChildProcess } from 'node:child_process'
import { relative } from 'node:path'
import { describeExit, hasExited, sleep, type Service } from './processes'

/** How often a service may be restarted before the stack gives up. */
export interface RestartPolicy {
  maxRestarts: number
  windowMs: number
  /** Wait before the n-th restart in the window (the last value repeats). */
  backoffMs: number[]
}

export const RESTART_POLICY: RestartPolicy = { maxRestarts: 5, windowMs: 10 * 60_000, backoffMs: [1000, 2000, 4000, 8000, 15_000] }

/** POMEWRIGHT_MAX_RESTARTS sets how many restarts each service gets in the window (0: none). */
export function restartPolicy(env: NodeJS.ProcessEnv = process.env): RestartPolicy {
  const raw = env.POMEWRIGHT_MAX_RESTARTS
  if (raw === undefined || raw === '') return RESTART_POLICY
  const maxRestarts = Number(raw)
  if (!Number.isInteger(maxRestarts) || maxRestarts < 0) throw new Error(`POMEWRIGHT_MAX_RESTARTS must be a whole number, got "${raw}"`)
  return { ...RESTART_POLICY, maxRestarts }
}

export type RestartDecision = { restart: true, attempt: number, delayMs: number } | { restart: false }

/** Pure: whether a service that has just stopped may start again, given when it was last restarted. */
export function nextRestart(restartedAt: number[], now: number, policy: RestartPolicy = RESTART_POLICY): RestartDecision {
  const recent = restartedAt.filter(t => now - t < policy.windowMs).length
  if (recent >= policy.maxRestarts) return { restart: false }
  return { restart: true, attempt: recent + 1, delayMs: policy.backoffMs[Math.min(recent, policy.backoffMs.length - 1)]! }
}

export interface Watched {
  service: Service
  /** Resolves once the (re)started service answers; rejects when it exits or never answers. */
  ready: () => Promise<void>
}

export interface SupervisorHooks {
  /** True once a deliberate stop has begun: exits are then expected. */
  stopping: () => boolean
  /** A service has a new process (the lock file lists children's pids). */
  restarted: (service: Service) => void
  /** Too many restarts: the stack must stop. */
  giveUp: (message: string) => void
  policy: RestartPolicy
}

/**
 * Watches running services: one that exits unexpectedly is reported at once and started again
 * after a short wait, up to `policy.maxRestarts` times within `policy.windowMs`; after that the
 * stack gives up. Exits during a deliberate stop are ignored.
 */
export function supervise(watched: Watched[], root: string, hooks: SupervisorHooks): void {
  const { policy } = hooks
  const minutes = policy.windowMs / 60_000
  for (const { service, ready } of watched) {
    const restartedAt: number[] = []

    const exited = async (child: ChildProcess) => {
      if (hooks.stopping() || child !== service.child) return
      const log = relative(root, service.logFile)
      console.error(`\n==> ${service.name} stopped unexpectedly: it ${describeExit(child.exitCode, child.signalCode)} (log: ${log})`)
      const decision = nextRestart(restartedAt, Date.now(), policy)
      if (!decision.restart) {
        hooks.giveUp(`Giving up on ${service.name}: it keeps stopping (${policy.maxRestarts} restarts in ${minutes} minutes is the limit). Stopping everything; see ${log}.`)
        return
      }
      restartedAt.push(Date.now())
      console.error(`==> Restarting ${service.name} in ${decision.delayMs / 1000} s (restart ${decision.attempt} of ${policy.maxRestarts} allowed in ${minutes} minutes)`)
      await sleep(decision.delayMs)
      if (hooks.stopping()) return
      const next = service.respawn()
      hooks.restarted(service)
      watch(next)
      try {
        await ready()
        console.log(`==> ${service.name} is running again (process ${next.pid})`)
      }
      catch (error) {
        if (hooks.stopping()) return
        console.error(`==> ${service.name} did not come back: ${(error as Error).message}`)
        // Still running but not answering: end it, and its exit counts as the next failure.
        if (!hasExited(next) && next.pid) {
          try {
            process.kill(-next.pid, 'SIGKILL')
          }
          catch { /* already gone */ }
        }
      }
    }

    const watch = (child: ChildProcess) => {
      if (hasExited(child)) void exited(child)
      else child.once('exit', () => void exited(child))
    }
    watch(service.child)
  }
}
