import { fileURLToPath } from 'node:url'
import { defineConfig } from 'vitest/config'

// Three projects: pure functions, HTTP routes against the running stack, and the browser.
// scripts/stack/tests.ts starts the stack before vitest runs and passes its addresses in the environment.
// The api and e2e projects share one database (the backup test restores it), so the projects run in turn.
export default defineConfig({
  resolve: { alias: { '#shared': fileURLToPath(new URL('./shared', import.meta.url)) } },
  test: {
    projects: [
      { extends: true, test: { name: 'unit', sequence: { groupOrder: 0 }, include: ['tests/unit/**/*.test.ts'], environment: 'node', benchmark: { include: ['tests/bench/**/*.bench.ts'] } } },
      { extends: true, test: { name: 'api', sequence: { groupOrder: 1 }, include: ['tests/api/**/*.test.ts'], environment: 'node', testTimeout: 60_000, hookTimeout: 120_000, fileParallelism: false } },
      { extends: true, test: { name: 'e2e', sequence: { groupOrder: 2 }, include: ['tests/e2e/**/*.test.ts'], environment: 'node', testTimeout: 120_000, hookTimeout: 120_000, fileParallelism: false } },
    ],
  },
})
