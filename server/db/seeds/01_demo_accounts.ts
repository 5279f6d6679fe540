import type { Knex } from 'knex'
import { hashPassword } from '../../utils/passwords'

// The invented Estry valley (see the README's demo sign-ins). Every name here is made up.
export const DEMO_PASSWORD = 'pomewright-demo'

const organisations = [
  { key: 'hollowmere', name: 'Hollowmere Orchard & Nursery', kind: 'grower', is_nursery: true, region: 'Estry valley, north slope', contact_email: 'grower@demo.test', currency: 'GBP' },
  { key: 'tansy', name: 'Tansy Row Fruit', kind: 'grower', is_nursery: false, region: 'Estry valley, river flats', contact_email: 'grower2@demo.test', currency: 'GBP' },
  { key: 'quillhurst', name: 'Quillhurst Cider Works', kind: 'maker', is_nursery: false, region: 'Quillhurst, Estry valley', contact_email: 'maker@demo.test', currency: 'GBP', press_type: 'belt', default_juice_yield_l_per_t: 700 },
  { key: 'marrowby', name: 'Marrowby Perry House', kind: 'maker', is_nursery: false, region: 'Marrowby, lower Estry', contact_email: 'maker2@demo.test', currency: 'GBP', press_type: 'rack and cloth', default_juice_yield_l_per_t: 650 },
] as const

const people = [
  { email: 'grower@demo.test', name: 'Ines Varga', org: 'hollowmere', role: 'owner', units: 'metric' },
  { email: 'grower-member@demo.test', name: 'Tomas Reyne', org: 'hollowmere', role: 'member', units: 'metric' },
  { email: 'grower2@demo.test', name: 'Priya Halloran', org: 'tansy', role: 'owner', units: 'metric' },
  { email: 'maker@demo.test', name: 'Olu Brandt', org: 'quillhurst', role: 'owner', units: 'metric' },
  { email: 'viewer@demo.test', name: 'Greta Moss', org: 'quillhurst', role: 'viewer', units: 'metric' },
  { email: 'maker2@demo.test', name: 'Dara Kimble', org: 'marrowby', role: 'owner', units: 'us' },
  { email: 'admin@demo.test', name: 'Sam Okafor', org: null, role: 'admin', units: 'metric' },
] as const

export async function seed(knex: Knex): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD)
  await knex.transaction(async (trx) => {
    const ids = new Map<string, number>()
    for (const { key, ...org } of organisations) {
      const [id] = await trx('organisations').insert({ ...org, status: 'active' })
      ids.set(key, id!)
    }
    for (const person of people) {
      await trx('users').insert({
        email: person.email,
        name: person.name,
        org_id: person.org ? ids.get(person.org) : null,
        role: person.role,
        units: person.units,
        password_hash: passwordHash,
        email_verified_at: trx.fn.now(3),
      })
    }
  })
}
