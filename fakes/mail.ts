import { createServer as createHttpServer, type Server } from 'node:http'
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

// A local SMTP sink: accepts every message and keeps it in memory so tests and developers can
// read it back over HTTP (GET /messages?to=… for one address, ?toContains=… for every address with
// that text in it; DELETE /messages).
export interface CapturedMessage { id: number, from: string, to: string[], subject: string, text: string, html: string, receivedAt: string }

export function startMailSink(smtpPort: number, apiPort: number): Promise<{ smtp: SMTPServer, api: Server }> {
  const messages: CapturedMessage[] = []
  let nextId = 1

  const smtp = new SMTPServer({
    authOptional: true,
    // The package's built-in certificate has expired; a loopback sink needs no TLS.
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream).then((mail) => {
        messages.push({
          id: nextId++,
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          to: session.envelope.rcptTo.map(r => r.address.toLowerCase()),
          subject: mail.subject ?? '',
          text: mail.text ?? '',
          html: typeof mail.html === 'string' ? mail.html : '',
          receivedAt: new Date().toISOString(),
        })
        callback()
      }, callback)
    },
  })

  const api = createHttpServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://localhost')
    res.setHeader('content-type', 'application/json')
    if (url.pathname === '/health') return res.end(JSON.stringify({ ok: true }))
    if (url.pathname === '/messages' && req.method === 'GET') {
      const to = url.searchParams.get('to')?.toLowerCase()
      const part = url.searchParams.get('toContains')?.toLowerCase()
      const items = messages.filter(m => (!to || m.to.includes(to)) && (!part || m.to.some(address => address.includes(part))))
      return res.end(JSON.stringify({ items, total: items.length }))
    }
    if (url.pathname === '/messages' && req.method === 'DELETE') {
      messages.length = 0
      return res.end(JSON.stringify({ ok: true }))
    }
    res.statusCode = 404
    res.end(JSON.stringify({ statusCode: 404, message: 'Not found' }))
  })

  return new Promise((resolve, reject) => {
    smtp.on('error', reject)
    api.on('error', reject)
    smtp.listen(smtpPort, '127.0.0.1', () => api.listen(apiPort, '127.0.0.1', () => resolve({ smtp, api })))
  })
}
