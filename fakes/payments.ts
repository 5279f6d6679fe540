import { createServer, type Server } from 'node:http'

// A local stand-in for the payment processor's API. It answers only the calls the app makes
// (none yet beyond a health check) and the processor's error shape for everything else.
export function startPayments(port: number): Promise<Server> {
  const server = createServer((req, res) => {
    res.setHeader('content-type', 'application/json')
    if (req.url === '/health') return res.end(JSON.stringify({ ok: true }))
    res.statusCode = 404
    res.end(JSON.stringify({ error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${req.url}).` } }))
  })
  return new Promise((resolve, reject) => {
    server.on('error', reject)
    server.listen(port, '127.0.0.1', () => resolve(server))
  })
}
