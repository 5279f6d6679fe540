import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { run } from './processes'
import { appUrl, databaseUrl, serviceEnv, type Profile } from './profile'

interface VitestReport { numPassedTests: number, numFailedTests: number, numTotalTests: number, numFailedTestSuites: number, numPendingTests: number }

/**
 * Lints, then runs every vitest project (unit, api, e2e) once, then prints the closing line
 * `N passed, N failed` computed from vitest's own JSON report. A lint error counts as one failure.
 */
export async function runTests(p: Profile, patterns: string[], signal?: AbortSignal): Promise<number> {
  const outDir = join(p.root, 'test-results')
  mkdirSync(outDir, { recursive: true })
  const reportFile = join(outDir, 'vitest.json')
  rmSync(reportFile, { force: true })
  const env = {
    ...serviceEnv(p),
    NODE_ENV: 'test',
    POMEWRIGHT_APP_URL: appUrl(p),
    POMEWRIGHT_DATABASE_URL: databaseUrl(p),
    POMEWRIGHT_MAIL_API_URL: `http://127.0.0.1:${p.mailApiPort}`,
    POMEWRIGHT_PAYMENTS_URL: `http://127.0.0.1:${p.paymentsPort}`,
    POMEWRIGHT_S3_URL: `http://127.0.0.1:${p.s3Port}`,
    POMEWRIGHT_TEST_OUTPUT: outDir,
  }
  // vitest reads tsconfig.json, which refers to the files `nuxt prepare` generates; eslint.config.mjs
  // builds on the ESLint config it writes there.
  const prepared = ['tsconfig.app.json', 'eslint.config.mjs'].every(file => existsSync(join(p.root, '.nuxt', file)))
  if (!prepared) {
    await run(process.execPath, [join(p.root, 'node_modules', 'nuxt', 'bin', 'nuxt.mjs'), 'prepare'], { cwd: p.root, env: { POMEWRIGHT_BUILD_DIR: '.nuxt' } })
  }
  console.log('==> Lint (eslint .)')
  const lint = await run(process.execPath, [join(p.root, 'node_modules', 'eslint', 'bin', 'eslint.js'), '.'], { cwd: p.root, env: { POMEWRIGHT_BUILD_DIR: '.nuxt' } })
  if (lint !== 0) {
    console.log('\nLint failed (npm run lint), so the tests did not run.\n0 passed, 1 failed')
    return lint
  }
  const code = await run(process.execPath, [join(p.root, 'node_modules', 'vitest', 'vitest.mjs'), 'run',
    '--reporter=default', '--reporter=json', `--outputFile.json=${reportFile}`, ...patterns], { cwd: p.root, env, signal })

  if (!existsSync(reportFile)) {
    console.log('\nThe test runner wrote no report.\n0 passed, 1 failed')
    return code || 1
  }
  const report = JSON.parse(readFileSync(reportFile, 'utf8')) as VitestReport
  // A file that fails to load has no tests of its own to fail: count it as one failure.
  const failed = report.numFailedTests + (report.numFailedTests === 0 ? report.numFailedTestSuites : 0)
  const passed = report.numPassedTests
  if (report.numTotalTests === 0) console.log('\nNo test matched.')
  console.log(`\n${passed} passed, ${failed} failed`)
  return failed > 0 || code !== 0 || report.numTotalTests === 0 ? 1 : 0
}
