import { describe, expect, it } from 'vitest'
import { camelRows } from '../../server/db/config'

class FieldPacket { constructor(public name: string, public orgTable: string) {} }

describe('rows at the database edge', () => {
  it('gives a row’s snake_case columns camelCase keys and leaves the values alone', () => {
    const created = new Date('2026-11-30T08:00:00.000Z')
    expect(camelRows({ id: 3, org_id: 1, ta_g_per_l: 5.6, yield_per_tree_kg: 22.5, created_at: created, notes: null }))
      .toEqual({ id: 3, orgId: 1, taGPerL: 5.6, yieldPerTreeKg: 22.5, createdAt: created, notes: null })
  })

  it('converts every row of a list and both halves of a raw query’s [rows, fields] pair, but no class instance', () => {
    const packet = new FieldPacket('org_id', 'users')
    const [rows, fields] = camelRows([[{ org_id: 1 }, { org_id: 2 }], [packet]]) as [unknown[], unknown[]]
    expect(rows).toEqual([{ orgId: 1 }, { orgId: 2 }])
    expect(fields[0]).toBe(packet)
    expect(camelRows([7, 8])).toEqual([7, 8])
    expect(camelRows(undefined)).toBeUndefined()
  })

  it('does not reach into a column’s value', () => {
    expect(camelRows({ detail: { from_state: 'a' } })).toEqual({ detail: { from_state: 'a' } })
  })
})
