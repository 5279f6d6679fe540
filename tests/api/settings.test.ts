import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { testDb } from '../support/db'
import { as } from '../support/http'

// Organisation settings: owners change them, with every field checked by the shared schema, the
// fields of another kind refused, read-only fields ignored and each change audited. The demo
// organisations' rows are put back as they were afterwards.
const db = testDb()
const ORGS = ['Hollowmere Orchard & Nursery', 'Tansy Row Fruit', 'Quillhurst Cider Works', 'Marrowby Perry House']
let saved: Record<string, unknown>[] = []

beforeAll(async () => {
  saved = await db('organisations').whereIn('name', ORGS).select()
})

afterAll(async () => {
  for (const { id, ...row } of saved) await db('organisations').where({ id }).update(row)
})

const COMMON_KEYS = [
  'id', 'name', 'kind', 'isNursery', 'status', 'region', 'countryCode', 'description', 'contactName', 'contactPhone', 'publicEmail', 'contactEmail',
  'hemisphere', 'currency', 'taxRatePct', 'listed', 'hydrometerCalibrationC', 'paymentAccountId', 'createdAt', 'updatedAt',
]

async function issuesOf(caller: Parameters<typeof as>[0], body: unknown) {
  const res = await (await as(caller)).patch('/api/organisation', body)
  return { status: res.status, paths: (res.body?.data?.issues ?? []).map((i: { path: string }) => i.path), message: res.body?.message as string }
}

describe('reading the settings', () => {
  it('gives a maker its press fields and no nursery field, with the demo values', async () => {
    const res = await (await as('makerViewer')).get('/api/organisation')
    expect(res.status).toBe(200)
    expect(Object.keys(res.body).sort()).toEqual([...COMMON_KEYS, 'pressType', 'defaultJuiceYieldLPerT'].sort())
    // A belt press at about 750 L per tonne, 75 % (common practice); hydrometers calibrated at 20 °C.
    expect(res.body).toMatchObject({
      name: 'Quillhurst Cider Works', kind: 'maker', hemisphere: 'north', currency: 'GBP', listed: true,
      pressType: 'belt', defaultJuiceYieldLPerT: 750, hydrometerCalibrationC: 20, paymentAccountId: null,
    })
  })

  it('gives a nursery its plant-health registration number and no press fields', async () => {
    const res = await (await as('growerMember')).get('/api/organisation')
    expect(res.status).toBe(200)
    expect(Object.keys(res.body).sort()).toEqual([...COMMON_KEYS, 'plantHealthRegNo'].sort())
    expect(res.body).toMatchObject({ name: 'Hollowmere Orchard & Nursery', isNursery: true, plantHealthRegNo: expect.stringMatching(/^GB-\d+$/) })
  })

  it('gives Hollowmere its country, GB, the code its registration number starts with', async () => {
    const res = await (await as('growerMember')).get('/api/organisation')
    expect(res.body).toMatchObject({ countryCode: 'GB', plantHealthRegNo: 'GB-40917' })
  })

  it('gives a grower without a nursery neither', async () => {
    const res = await (await as('grower2Owner')).get('/api/organisation')
    expect(Object.keys(res.body).sort()).toEqual([...COMMON_KEYS].sort())
  })
})

describe('checking each field', () => {
  const cases: [field: string, value: unknown][] = [
    ['name', ''], ['name', 'x'.repeat(161)], ['name', 12],
    ['region', 'x'.repeat(121)], ['region', 5],
    ['description', 'x'.repeat(501)],
    ['contactName', 'x'.repeat(121)],
    ['contactPhone', 'call me'], ['contactPhone', '12'], ['contactPhone', `+44 ${'1'.repeat(40)}`],
    ['publicEmail', 'not an address'], ['publicEmail', 7],
    ['contactEmail', 'nope'], ['contactEmail', null], ['contactEmail', ''],
    ['hemisphere', 'east'], ['hemisphere', null],
    ['currency', 'gbp'], ['currency', 'XYZ'], ['currency', null],
    ['taxRatePct', -1], ['taxRatePct', 100.01], ['taxRatePct', 17.555], ['taxRatePct', '20'],
    ['listed', 'yes'], ['listed', null],
    ['hydrometerCalibrationC', 9.99], ['hydrometerCalibrationC', 31], ['hydrometerCalibrationC', null], ['hydrometerCalibrationC', 15.555],
    ['pressType', 'hydraulic'], ['pressType', 'rack and cloth'],
    ['defaultJuiceYieldLPerT', 75], ['defaultJuiceYieldLPerT', 1000], ['defaultJuiceYieldLPerT', 'lots'],
  ]
  it.each(cases)('refuses %s = %j with 400 naming the field', async (field, value) => {
    const { status, paths } = await issuesOf('makerOwner', { [field]: value })
    expect(status).toBe(400)
    expect(paths).toEqual([field])
  })

  it.each([['plantHealthRegNo', '??'], ['plantHealthRegNo', 'x'.repeat(41)]])('refuses a nursery’s %s = %j', async (field, value) => {
    const { status, paths } = await issuesOf('growerOwner', { [field]: value })
    expect(status).toBe(400)
    expect(paths).toEqual([field])
  })

  // ISO 3166-1 alpha-2: two capital letters (the form capitalises what is typed before it sends).
  it.each([['gb'], ['GBR'], ['G'], ['G1'], ['U.K.'], [44]])('refuses countryCode = %j with 400 naming countryCode', async (value) => {
    const { status, paths, message } = await issuesOf('makerOwner', { countryCode: value })
    expect(status).toBe(400)
    expect(paths).toEqual(['countryCode'])
    expect(message).toMatch(/countryCode/)
  })

  it('names every field at fault at once, and an empty patch has nothing to change', async () => {
    const { status, paths } = await issuesOf('makerOwner', { hemisphere: 'east', currency: 'XYZ', colour: 'red' })
    expect(status).toBe(400)
    expect(paths.sort()).toEqual(['colour', 'currency', 'hemisphere'])
    expect((await issuesOf('makerOwner', {})).status).toBe(400)
  })

  it('refuses unknown keys, naming each', async () => {
    const { status, paths, message } = await issuesOf('makerOwner', { hemisphere: 'north', colour: 'red', payment_account_id: 'acct_1' })
    expect(status).toBe(400)
    expect(paths.sort()).toEqual(['colour', 'payment_account_id'])
    expect(message).toMatch(/colour|payment_account_id/)
  })

  it('refuses the fields that do not apply to the organisation’s kind, naming them', async () => {
    expect(await issuesOf('growerOwner', { pressType: 'belt' })).toMatchObject({ status: 400, paths: ['pressType'] })
    expect(await issuesOf('grower2Owner', { defaultJuiceYieldLPerT: 700, plantHealthRegNo: 'GB-1' })).toMatchObject({ status: 400 })
    expect((await issuesOf('grower2Owner', { defaultJuiceYieldLPerT: 700, plantHealthRegNo: 'GB-1' })).paths.sort()).toEqual(['defaultJuiceYieldLPerT', 'plantHealthRegNo'])
    expect(await issuesOf('makerOwner', { plantHealthRegNo: null })).toMatchObject({ status: 400, paths: ['plantHealthRegNo'] })
  })
})

describe('changing the settings', () => {
  it('stores each field, rounds nothing away, and answers the new settings', async () => {
    const owner = await as('maker2Owner')
    const res = await owner.patch('/api/organisation', {
      name: '  Marrowby Perry House  ', region: 'Marrowby, lower Estry', description: 'Perry pears pressed on a rack and cloth.',
      contactName: 'Dara Kimble', contactPhone: '+44 1632 960781', publicEmail: 'pears@marrowby.demo.test', contactEmail: 'maker2@demo.test',
      hemisphere: 'south', currency: 'USD', taxRatePct: 8.25, listed: true, hydrometerCalibrationC: 15.56, pressType: 'pneumatic', defaultJuiceYieldLPerT: 712.5,
    })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({
      name: 'Marrowby Perry House', hemisphere: 'south', currency: 'USD', taxRatePct: 8.25, hydrometerCalibrationC: 15.56, pressType: 'pneumatic', defaultJuiceYieldLPerT: 712.5, contactPhone: '+44 1632 960781',
    })
    const row = await db('organisations').where({ name: 'Marrowby Perry House' }).first()
    expect(row).toMatchObject({ hemisphere: 'south', currency: 'USD', press_type: 'pneumatic' })
    expect(Number(row.tax_rate_pct)).toBe(8.25)
    expect(Number(row.hydrometer_calibration_c)).toBe(15.56)

    // Empty optional text and figures are cleared to null.
    const cleared = await owner.patch('/api/organisation', { description: '  ', taxRatePct: null, pressType: null, defaultJuiceYieldLPerT: null, publicEmail: '' })
    expect(cleared.status).toBe(200)
    expect(cleared.body).toMatchObject({ description: null, taxRatePct: null, pressType: null, defaultJuiceYieldLPerT: null, publicEmail: null })
  })

  it('ignores the read-only fields sent back with the settings', async () => {
    const owner = await as('grower2Owner')
    const current = (await owner.get('/api/organisation')).body
    const res = await owner.patch('/api/organisation', { ...current, region: 'Estry valley, the river flats', id: 1, kind: 'maker', isNursery: true, status: 'suspended', paymentAccountId: 'acct_typed', paymentCustomerId: 'cus_typed', createdAt: 'then', updatedAt: 'now' })
    expect(res.status).toBe(200)
    // Tansy Row's payment account is the one it connected (the demo's), not the one typed.
    expect(current.paymentAccountId).toBe('acct_demo_tansyrow')
    expect(res.body).toMatchObject({ id: current.id, kind: 'grower', isNursery: false, status: 'active', paymentAccountId: 'acct_demo_tansyrow', region: 'Estry valley, the river flats' })
    const row = await db('organisations').where({ id: current.id }).first()
    expect(row).toMatchObject({ kind: 'grower', is_nursery: false, status: 'active', payment_account_id: 'acct_demo_tansyrow', payment_customer_id: null })
  })

  it('lets a nursery set its plant-health registration number', async () => {
    const res = await (await as('growerOwner')).patch('/api/organisation', { plantHealthRegNo: 'GB-40918' })
    expect(res.status).toBe(200)
    expect(res.body.plantHealthRegNo).toBe('GB-40918')
  })

  it('lets any organisation set its country as two capital letters, and clear it', async () => {
    const owner = await as('maker2Owner')
    const set = await owner.patch('/api/organisation', { countryCode: 'IE' })
    expect(set.status).toBe(200)
    expect(set.body.countryCode).toBe('IE')
    expect((await db('organisations').where({ id: set.body.id }).first('country_code')).country_code).toBe('IE')
    const cleared = await owner.patch('/api/organisation', { countryCode: '' })
    expect(cleared.status).toBe(200)
    expect(cleared.body.countryCode).toBeNull()
  })

  it('records each change in the audit trail with the fields and their values before and after, and nothing for no change', async () => {
    const owner = await as('makerOwner')
    const orgId = (await owner.get('/api/organisation')).body.id
    const before = await db('audit_events').where({ object_type: 'organisation', object_id: orgId }).max({ id: 'id' }).first()
    const res = await owner.patch('/api/organisation', { hemisphere: 'south', listed: false, defaultJuiceYieldLPerT: 760, currency: 'GBP', description: 'Medium-dry cider from Estry fruit.' })
    expect(res.status).toBe(200)
    const events = await db('audit_events').where({ object_type: 'organisation', object_id: orgId }).where('id', '>', before?.id ?? 0).select()
    expect(events).toHaveLength(1)
    const user = await db('users').where({ email: 'maker@demo.test' }).first('id')
    expect(events[0]).toMatchObject({ action: 'organisation.settings_changed', org_id: orgId, actor_user_id: user.id })
    const detail = typeof events[0].detail === 'string' ? JSON.parse(events[0].detail) : events[0].detail
    // The currency was already GBP: not a change.
    expect(detail.changed.sort()).toEqual(['defaultJuiceYieldLPerT', 'description', 'hemisphere', 'listed'])
    expect(detail.before).toEqual({ hemisphere: 'north', listed: true, defaultJuiceYieldLPerT: 750 })
    expect(detail.after).toEqual({ hemisphere: 'south', listed: false, defaultJuiceYieldLPerT: 760 })

    const again = await owner.patch('/api/organisation', { hemisphere: 'south', listed: false })
    expect(again.status).toBe(200)
    expect(await db('audit_events').where({ object_type: 'organisation', object_id: orgId }).where('id', '>', before?.id ?? 0).count({ n: '*' }).first()).toEqual({ n: 1 })
  })

  it('lets only owners change the settings', async () => {
    expect((await (await as('makerViewer')).patch('/api/organisation', { hemisphere: 'north' })).status).toBe(403)
    expect((await (await as('growerMember')).patch('/api/organisation', { hemisphere: 'north' })).status).toBe(403)
    expect((await (await as('admin')).patch('/api/organisation', { hemisphere: 'north' })).status).toBe(403)
  })
})
