import type { FakeSession } from './store'

// The fake processor's own hosted payment page: plain HTML, no scripts or outside files. A person
// (or a browser test) chooses to pay or to fail; the form posts back to the fake.

const escape = (text: string) => text.replace(/[&<>"']/g, c => `&#${c.charCodeAt(0)};`)

function amount(minor: number, currency: string): string {
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100)
}

export function hostedPage(session: FakeSession): string {
  const open = session.status === 'open'
  const body = open
    ? `<p>This is the local test payment page. No money moves.</p>
  <form method="post" action="/pay/${escape(session.id)}/pay"><button type="submit">Pay ${escape(amount(session.amount_total, session.currency))}</button></form>
  <form method="post" action="/pay/${escape(session.id)}/fail"><button type="submit">Fail the payment</button></form>`
    : `<p>This payment is ${session.status === 'complete' ? 'complete' : 'no longer open'}.</p><p><a href="${escape(session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id))}">Back to the shop</a></p>`
  return `<!doctype html>
<html lang="en">
<head><meta charset="utf-8"><title>Test payment</title>
<style>body{font-family:sans-serif;max-width:32rem;margin:3rem auto;padding:0 1rem}button{font-size:1rem;padding:.5rem 1rem;margin:.5rem 0}</style></head>
<body>
  <h1>Test payment</h1>
  <p><strong>${escape(session.description)}</strong></p>
  <p>Amount: ${escape(amount(session.amount_total, session.currency))}</p>
  <p>Paid to account ${escape(session.destination)}</p>
  ${body}
</body>
</html>`
}
