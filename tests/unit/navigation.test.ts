import { describe, expect, it } from 'vitest'
import { navigationFor } from '../../shared/utils/navigation'

const labels = (items: { label: string }[]) => items.map(i => i.label)

describe('navigation per role', () => {
  it('shows a grower the orchard pages and members', () => {
    const items = labels(navigationFor({ orgKind: 'grower', role: 'owner', isNursery: true }))
    expect(items).toContain('Orchard blocks')
    expect(items).toContain('Members')
    expect(items).not.toContain('Organisations')
  })

  it('does not show a maker the orchard pages', () => {
    const items = labels(navigationFor({ orgKind: 'maker', role: 'viewer', isNursery: false }))
    expect(items).not.toContain('Orchard blocks')
    expect(items).toContain('Members')
  })

  it('shows the platform admin organisations but no tenant pages', () => {
    const items = labels(navigationFor({ orgKind: null, role: 'admin', isNursery: false }))
    expect(items).toContain('Organisations')
    expect(items).not.toContain('Members')
    expect(items).not.toContain('Orchard blocks')
  })

  it('shows a signed-out visitor only the public calculators', () => {
    expect(labels(navigationFor(null))).toEqual(['Calculators'])
  })
})
