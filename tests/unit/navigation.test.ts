import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import type { OrgKind, Role } from '../../shared/types/auth'
import { decideAccess, PAGE_RULES, type AccessRule, type AccessSubject, type PagePath } from '../../shared/utils/access'
import { NAV_ITEMS, navigationFor } from '../../shared/utils/navigation'

const labels = (items: { label: string }[]) => items.map(i => i.label)

describe('navigation per role', () => {
  it('shows a grower the orchard pages and members', () => {
    const items = labels(navigationFor({ orgKind: 'grower', role: 'owner', isNursery: true }))
    expect(items).toContain('Orchard blocks')
    expect(items).toContain('Members')
    expect(items).not.toContain('Organisations')
  })

  it('shows a grower its harvest lots right after the orchard blocks', () => {
    const items = labels(navigationFor({ orgKind: 'grower', role: 'viewer', isNursery: false }))
    expect(items.slice(items.indexOf('Orchard blocks'), items.indexOf('Orchard blocks') + 2)).toEqual(['Orchard blocks', 'Lots'])
  })

  it('shows both sides of a fruit contract its deliveries right after the contracts', () => {
    for (const orgKind of ['grower', 'maker'] as const) {
      const items = labels(navigationFor({ orgKind, role: 'viewer', isNursery: false }))
      expect(items.slice(items.indexOf('Contracts'), items.indexOf('Contracts') + 2), orgKind).toEqual(['Contracts', 'Deliveries'])
    }
    // The season statements are reached from the deliveries page, not the main navigation.
    expect(NAV_ITEMS.map(i => i.to)).not.toContain('/statements')
  })

  it('shows every organisation its payments right after the deliveries, and the platform admin none', () => {
    for (const orgKind of ['grower', 'maker'] as const) {
      const items = labels(navigationFor({ orgKind, role: 'viewer', isNursery: false }))
      expect(items.slice(items.indexOf('Deliveries'), items.indexOf('Deliveries') + 2), orgKind).toEqual(['Deliveries', 'Payments'])
    }
    expect(labels(navigationFor({ orgKind: null, role: 'admin', isNursery: false }))).not.toContain('Payments')
  })

  it('shows a maker the lots its contracts cover', () => {
    expect(labels(navigationFor({ orgKind: 'maker', role: 'viewer', isNursery: false }))).toContain('Lots')
  })

  it('shows a maker the blend planner right after the lots, and a grower and the platform admin none', () => {
    for (const role of ['owner', 'member', 'viewer'] as const) {
      const items = labels(navigationFor({ orgKind: 'maker', role, isNursery: false }))
      expect(items.slice(items.indexOf('Lots'), items.indexOf('Lots') + 2), role).toEqual(['Lots', 'Blends'])
    }
    expect(labels(navigationFor({ orgKind: 'grower', role: 'owner', isNursery: true }))).not.toContain('Blends')
    expect(labels(navigationFor({ orgKind: null, role: 'admin', isNursery: false }))).not.toContain('Blends')
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
    expect(items).not.toContain('Lots')
    expect(items).not.toContain('Deliveries')
  })

  it('shows a signed-out visitor only the public calculators', () => {
    expect(labels(navigationFor(null))).toEqual(['Calculators'])
  })
})

// Every page file and the route path it serves (`blocks/[id].vue` → `/blocks/:id`).
const pagesDir = fileURLToPath(new URL('../../pages', import.meta.url))
const pageFiles = (dir: string): string[] => readdirSync(dir, { withFileTypes: true })
  .flatMap(e => (e.isDirectory() ? pageFiles(join(dir, e.name)) : e.name.endsWith('.vue') ? [join(dir, e.name)] : []))
const routeOf = (file: string) => `/${relative(pagesDir, file).replace(/\.vue$/, '').replace(/(^|\/)index$/, '').replace(/\[(\w+)\]/g, ':$1')}`.replace(/\/$/, '') || '/'
const pages = new Map(pageFiles(pagesDir).map((file) => {
  const source = readFileSync(file, 'utf8')
  return [routeOf(file), {
    /** The PAGE_RULES entry the page names in definePageMeta, if any. */
    rule: source.match(/definePageMeta\(\{[^}]*access: PAGE_RULES\['([^']+)'\]/)?.[1],
    /** Pages for visitors: the auth module lets signed-out people in. */
    open: /definePageMeta\(\{[^}]*auth: (false|\{ unauthenticatedOnly: true)/.test(source),
  }]
}))

type Person = AccessSubject & { who: string }
const people: Person[] = [
  ...(['grower', 'maker'] as OrgKind[]).flatMap(orgKind => (['owner', 'member', 'viewer'] as Role[]).flatMap(role =>
    [false, true].map((isNursery): Person => ({ who: `${orgKind} ${role}${isNursery ? ' (nursery)' : ''}`, orgKind, role, isNursery })))),
  { who: 'platform admin', orgKind: null, role: 'admin', isNursery: false },
]

describe('page rules and navigation agree', () => {
  it('has every page that needs signing in name its own entry in the page rules, and every entry a page', () => {
    for (const [path, page] of pages) {
      if (page.open) expect(page.rule, path).toBeUndefined()
      else expect(page.rule, path).toBe(path)
    }
    for (const path of Object.keys(PAGE_RULES)) expect(pages.get(path)?.rule, path).toBe(path)
  })

  it('links each navigation item to a page, under the rule that page declares', () => {
    for (const item of NAV_ITEMS) {
      const page = pages.get(item.to)
      expect(page, item.to).toBeDefined()
      expect(page!.rule, item.to).toBe(item.to in PAGE_RULES ? item.to : undefined)
    }
  })

  it('offers each person exactly the pages the page rule lets them open', () => {
    for (const person of [...people, null]) {
      const offered = navigationFor(person).map(i => i.to)
      const mayOpen = NAV_ITEMS.map(i => i.to).filter((to) => {
        const rule = (PAGE_RULES as Record<string, AccessRule>)[to]
        return rule ? decideAccess(person, rule).ok : pages.get(to)!.open
      })
      expect(offered, person?.who ?? 'visitor').toEqual(mayOpen)
    }
  })

  it('offers a viewer no page for writing, and a member of a grower the page for adding a block', () => {
    const viewer = { orgKind: 'grower', role: 'viewer', isNursery: true } as const
    expect(decideAccess(viewer, PAGE_RULES['/blocks/new'])).toMatchObject({ ok: false, statusCode: 403 })
    expect(decideAccess({ ...viewer, role: 'member' }, PAGE_RULES['/blocks/new']).ok).toBe(true)
    expect(decideAccess({ ...viewer, orgKind: 'maker', role: 'owner' }, PAGE_RULES['/blocks/new']).ok).toBe(false)
    const writerPages = Object.entries(PAGE_RULES).filter(([, rule]) => rule.roles && !rule.roles.includes('viewer')).map(([path]) => path)
    expect(writerPages).toContain('/blocks/new')
    for (const person of people.filter(p => p.role === 'viewer')) {
      expect(navigationFor(person).map(i => i.to).filter(to => writerPages.includes(to)), person.who).toEqual([])
      for (const path of writerPages) expect(decideAccess(person, PAGE_RULES[path as PagePath]).ok, `${person.who} ${path}`).toBe(false)
    }
  })
})
