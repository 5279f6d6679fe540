// Addresses of the running test stack, passed in by scripts/stack.ts (npm test).
function required(name: string): string {
  const value = process.env[name]
  if (!value) throw new Error(`${name} is not set: run the tests with npm test, which starts the stack first.`)
  return value
}

export const testEnv = {
  get appUrl() { return required('POMEWRIGHT_APP_URL') },
  get databaseUrl() { return required('POMEWRIGHT_DATABASE_URL') },
  get mailApiUrl() { return required('POMEWRIGHT_MAIL_API_URL') },
  get outputDir() { return process.env.POMEWRIGHT_TEST_OUTPUT || 'test-results' },
}

export const DEMO_PASSWORD = 'pomewright-demo'
