import { join } from 'node:path'
import { run } from './processes'
import { appUrl, databaseUrl, storageEnv, type Profile } from './profile'

// Each benchmark is a script of its own, run against the bench stack that stack.ts started.
const BENCHMARKS = ['tests/bench/page-weight.ts', 'tests/bench/load.ts', 'tests/bench/lab-import.ts', 'tests/bench/blend-solve.ts']

/** Runs the page-weight and load benchmarks in turn; non-zero when one of them could not run. */
export async function runBenchmarks(p: Profile): Promise<number> {
  const env = {
    // The lab sheet import bench puts its sheets in the stack's file store.
    ...storageEnv(p),
    POMEWRIGHT_APP_URL: appUrl(p),
    POMEWRIGHT_DATABASE_URL: databaseUrl(p),
    POMEWRIGHT_TEST_OUTPUT: join(p.root, 'test-results'),
  }
  let worst = 0
  for (const script of BENCHMARKS) {
    console.log(`\n==> ${script}`)
    const code = await run(process.execPath, ['--import', 'tsx', join(p.root, script)], { cwd: p.root, env })
    worst = Math.max(worst, code)
  }
  return worst
}
