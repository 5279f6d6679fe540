import type { Knex } from 'knex'
import { hashPassword } from '../../utils/passwords'

// The invented Estry valley (see the README's demo sign-ins). Every name here is made up.
export const DEMO_PASSWORD = 'pomewright-demo'

// Settings as the demo shows them: all four listed in the directory, the valley in the northern
// hemisphere, hydrometers calibrated at 20 °C, prices in GBP. Quillhurst's belt press gives about
// 750 L per tonne (75 %, common practice). VAT: cider and young trees at the standard 20 %, fresh
// fruit zero-rated (UK, from memory). Phone numbers are in the UK's range kept for drama (Ofcom).
const valley = { status: 'active', hemisphere: 'north', currency: 'GBP', listed: true, hydrometer_calibration_c: 20 } as const

const organisations = [
  {
    key: 'hollowmere', name: 'Hollowmere Orchard & Nursery', kind: 'grower', is_nursery: true, region: 'Estry valley, north slope', contact_email: 'grower@demo.test',
    description: 'A mature 6 ha cider orchard of bittersweets and a sharp, with stool beds and nursery rows: cider trees budded to order on MM.106 and M.7.',
    contact_name: 'Ines Varga', contact_phone: '01632 960 114', public_email: 'orders@hollowmere.demo.test', tax_rate_pct: 20, plant_health_reg_no: 'GB-40917', country_code: 'GB',
  },
  {
    key: 'tansy', name: 'Tansy Row Fruit', kind: 'grower', is_nursery: false, region: 'Estry valley, river flats', contact_email: 'grower2@demo.test',
    description: 'A young orchard on the river flats growing bittersharp and sharp cider fruit on dwarfing stocks.',
    contact_name: 'Priya Halloran', contact_phone: '01632 960 287', public_email: 'fruit@tansyrow.demo.test', tax_rate_pct: 0,
  },
  {
    key: 'quillhurst', name: 'Quillhurst Cider Works', kind: 'maker', is_nursery: false, region: 'Quillhurst, Estry valley', contact_email: 'maker@demo.test',
    description: 'Presses about 120 t a season for a medium-dry cider; buys bittersweet and bittersharp fruit and contracts trees for new planting.',
    contact_name: 'Olu Brandt', contact_phone: '01632 960 530', public_email: 'fruit@quillhurst.demo.test', tax_rate_pct: 20, press_type: 'belt', default_juice_yield_l_per_t: 750,
  },
  {
    key: 'marrowby', name: 'Marrowby Perry House', kind: 'maker', is_nursery: false, region: 'Marrowby, lower Estry', contact_email: 'maker2@demo.test',
    description: 'A small perry house buying perry pears and dessert fruit.',
    contact_name: 'Dara Kimble', contact_phone: '01632 960 781', public_email: 'pears@marrowby.demo.test', tax_rate_pct: 20, press_type: 'rack-and-cloth', default_juice_yield_l_per_t: 650,
  },
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
  const [{ count }] = await knex('organisations').count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return
  const passwordHash = await hashPassword(DEMO_PASSWORD)
  await knex.transaction(async (trx) => {
    const ids = new Map<string, number>()
    for (const { key, ...org } of organisations) {
      const [id] = await trx('organisations').insert({ ...valley, ...org })
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
