// Strict-Transport-Security only on a request that came over HTTPS (directly, or through a proxy
// that says so in X-Forwarded-Proto when TRUST_PROXY=1). Over plain http a browser ignores the
// header anyway (RFC 6797, section 8.1), and a local http instance should not claim HTTPS.
const HSTS = 'max-age=31536000; includeSubDomains'

export default defineEventHandler((event) => {
  if (getRequestProtocol(event, { xForwardedProto: process.env.TRUST_PROXY === '1' }) === 'https') {
    setResponseHeader(event, 'Strict-Transport-Security', HSTS)
  }
})
