// A season's lab sheet of 10,000 readings (100 lots, 100 sampling days), read from the file store,
// checked row by row and imported through the API, five times on five copies of the sheet; the
// median time is the figure. Run by `npm run bench` against the bench stack (scripts/stack/bench.ts).
import { randomBytes } from 'node:crypto'
import { DeleteObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3'
import knexFactory from 'knex'
import { knexConfig } from '../../server/db/config'
import { useS3 } from '../../server/utils/s3'
import { testEnv } from '../support/env'
import { as } from '../support/http'

const ROWS = 10_000
const LOTS = 100
const RUNS = 5
/** The import of a sheet this size should answer within this. */
const TARGET_MS = 5_000

const db = knexFactory(knexConfig(testEnv.databaseUrl, { caseConversion: false }))
const { client, bucket } = useS3()
const day = (offset: number) => new Date(Date.UTC(2025, 8, 2) + offset * 86_400_000).toISOString().slice(0, 10)
const code = (i: number) => `BENCH-${String(i).padStart(3, '0')}`

function sheetText(): string {
  const lines = ['Lot,Date,Brix,TA,pH,Tannin']
  for (let i = 0; i < ROWS; i++) {
    lines.push(`${code(i % LOTS)},${day(Math.floor(i / LOTS))},${(10 + (i % 60) / 10).toFixed(1)},${(2 + (i % 70) / 10).toFixed(1)},${(3.2 + (i % 8) / 10).toFixed(2)},${(1 + (i % 20) / 10).toFixed(1)}`)
  }
  return `${lines.join('\n')}\n`
}

async function main() {
  const grower = await as('growerOwner')
  const org = await db('organisations').where({ name: 'Hollowmere Orchard & Nursery' }).first('id')
  const variety = await db('varieties').where({ name: 'Dabinett' }).first('id')
  const user = await db('users').where({ email: 'grower@demo.test' }).first('id')
  const lotIds: number[] = []
  for (let i = 0; i < LOTS; i++) {
    const [id] = await db('harvest_lots').insert({ org_id: org.id, code: code(i), variety_id: variety.id, picked_on: '2025-09-01', harvest_year: 2025, net_kg: 1000 })
    lotIds.push(id!)
  }
  const bytes = new TextEncoder().encode(sheetText())
  const sheetIds: number[] = []
  const keys: string[] = []
  const times: number[] = []
  try {
    for (let run = 0; run < RUNS; run++) {
      const key = `lab-sheets/${org.id}/bench-${randomBytes(8).toString('hex')}/season.csv`
      await client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: bytes, ContentType: 'text/csv' }))
      keys.push(key)
      const [id] = await db('lab_sheets').insert({
        org_id: org.id, name: 'season.csv', object_key: key, sha256: randomBytes(32).toString('hex'), size_bytes: bytes.length, content_type: 'text/csv',
        kind: 'csv', headers: JSON.stringify(['Lot', 'Date', 'Brix', 'TA', 'pH', 'Tannin']), uploaded_by_user_id: user.id, uploaded_by_name: 'Bench',
      })
      sheetIds.push(id!)
      const started = performance.now()
      const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix', ta: 'TA', ph: 'pH', tannin: 'Tannin' } })
      times.push(performance.now() - started)
      if (res.status !== 200 || res.body.imported !== ROWS) throw new Error(`The import answered ${res.status}: ${JSON.stringify(res.body).slice(0, 300)}`)
    }
  }
  finally {
    await db('juice_readings').whereIn('lab_sheet_id', sheetIds).delete()
    await db('lab_sheets').whereIn('id', sheetIds).delete()
    await db('harvest_lots').whereIn('id', lotIds).delete()
    for (const key of keys) await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }))
    await db.destroy()
  }
  const sorted = [...times].sort((a, b) => a - b)
  const median = sorted[Math.floor(RUNS / 2)]!
  console.log(`\nLab sheet import, ${ROWS.toLocaleString('en-GB')} rows read, checked and imported through the API (${RUNS} runs)`)
  console.log(`median ${median.toFixed(0)} ms, fastest ${sorted[0]!.toFixed(0)} ms, slowest ${sorted[RUNS - 1]!.toFixed(0)} ms`)
  console.log(median <= TARGET_MS ? `Within the ${TARGET_MS} ms target.` : `MISSES TARGET: over ${TARGET_MS} ms.`)
}

await main()
