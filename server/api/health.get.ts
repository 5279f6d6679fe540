import { useDb } from '../utils/db'

// For load balancers and the start script: 200 when the database answers, else 503.
export default defineEventHandler(async () => {
  try {
    await useDb().raw('SELECT 1')
  }
  catch {
    throw createError({ statusCode: 503, message: 'The database is not answering.' })
  }
  return { ok: true }
})
