// nuxt-security's request-size limiter looks at POST, PUT and DELETE bodies only; PATCH bodies
// get the same limit here, so every route that reads a body sees at most that much.
export default defineEventHandler((event) => {
  if (event.method !== 'PATCH') return
  const limiter = useRuntimeConfig().security.requestSizeLimiter
  const limit = limiter ? limiter.maxRequestSizeInBytes : undefined
  if (limit && Number(getRequestHeader(event, 'content-length')) >= limit) {
    throw createError({ statusCode: 413, statusMessage: 'Payload Too Large' })
  }
})
