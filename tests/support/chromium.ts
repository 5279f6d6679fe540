import { chromium, type Browser } from 'playwright-core'

/** Debian's Chromium, headless, with nothing reaching outside this machine. */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  })
}

// How Chromium words a Content Security Policy refusal in the console or in a thrown error.
const CSP_MESSAGE = /Content Security Policy|Refused to (load|execute|apply|connect|frame|evaluate|create|compile)/i

/**
 * Collects every Content Security Policy violation on pages of this context: the browser's
 * `securitypolicyviolation` event, and CSP refusals in the console or in uncaught errors.
 */
export async function watchCsp(context: import('playwright-core').BrowserContext, into: string[]): Promise<void> {
  await context.exposeBinding('__reportCspViolation', ({ page }, text: string) => {
    into.push(`${page.url()}: ${text}`)
  })
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { __reportCspViolation: (t: string) => void }).__reportCspViolation(`${e.effectiveDirective} blocked ${e.blockedURI || 'inline'} (${e.sourceFile}:${e.lineNumber})`)
    })
  })
  context.on('page', (page) => {
    page.on('console', (message) => {
      if (message.type() === 'error' && CSP_MESSAGE.test(message.text())) into.push(`${page.url()}: ${message.text()}`)
    })
    page.on('pageerror', (error) => {
      if (CSP_MESSAGE.test(error.message)) into.push(`${page.url()}: ${error.message}`)
    })
  })
}
