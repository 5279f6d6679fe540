import type { Knex } from 'knex'

// What each demo owner finds in the bell on first start: one notice read, one not, and the
// e-mail those notices went out as in the organisation's outbox (one Quillhurst message failed:
// a mistyped address the relay refused). All of it happens in the invented Estry valley.
interface DemoNotice { to: string, kind: string, subject: string, body: string, link: string | null, read: boolean, daysAgo: number }

const DEMO_NOTICES: DemoNotice[] = [
  { to: 'grower@demo.test', kind: 'member.joined', subject: 'Tomas Reyne accepted the invitation to Hollowmere Orchard & Nursery', body: 'Tomas Reyne (grower-member@demo.test) accepted the invitation and joined Hollowmere Orchard & Nursery as member.', link: '/members', read: true, daysAgo: 40 },
  { to: 'grower@demo.test', kind: 'block.reminder', subject: 'Chapel Piece: record this winter\'s tree losses', body: 'Chapel Piece (Yarlington Mill on MM.106) still shows 97 % of its trees standing from last winter. Update the share standing so the crop forecast stays true.', link: '/blocks', read: false, daysAgo: 2 },
  { to: 'grower2@demo.test', kind: 'account.welcome', subject: 'Tansy Row Fruit is open on Pomewright', body: 'Your e-mail is confirmed and Tansy Row Fruit is open. Add your blocks so makers can see what you will grow.', link: '/blocks', read: true, daysAgo: 30 },
  { to: 'grower2@demo.test', kind: 'block.reminder', subject: 'Top Flats comes into first crop next season', body: 'Top Flats (Stoke Red on G.41, planted 2022) is forecast its first crop next season. Check the trellis ties before the fruit loads them.', link: '/blocks', read: false, daysAgo: 1 },
  { to: 'maker@demo.test', kind: 'member.joined', subject: 'Greta Moss accepted the invitation to Quillhurst Cider Works', body: 'Greta Moss (viewer@demo.test) accepted the invitation and joined Quillhurst Cider Works as viewer.', link: '/members', read: true, daysAgo: 21 },
  { to: 'maker@demo.test', kind: 'member.invitation_failed', subject: 'An invitation could not be delivered', body: 'The invitation to cellar@quilhurst.example could not be delivered: the address looks mistyped. Check it and invite again.', link: '/members', read: false, daysAgo: 3 },
  { to: 'maker2@demo.test', kind: 'account.welcome', subject: 'Marrowby Perry House is open on Pomewright', body: 'Your e-mail is confirmed and Marrowby Perry House is open. Your pages show pounds, US gallons and acres; change it in the menu under your name.', link: '/', read: true, daysAgo: 25 },
  { to: 'maker2@demo.test', kind: 'catalogue.updated', subject: 'Perry pear classes in the catalogue', body: 'Perry pears now carry their own published classes, medium sharp among them; Blakeney Red and Thorn moved to medium sharp.', link: '/catalogue', read: false, daysAgo: 4 },
]

const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000)

export async function seed(knex: Knex): Promise<void> {
  const [{ count }] = await knex('notices').count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return
  // Seeds read rows through the database edge, so in camelCase.
  const users = await knex('users').whereIn('email', [...new Set(DEMO_NOTICES.map(n => n.to))]).select('id', 'email', 'orgId') as { id: number, email: string, orgId: number }[]
  const byEmail = new Map(users.map(u => [u.email, u]))
  await knex.transaction(async (trx) => {
    for (const n of DEMO_NOTICES) {
      const user = byEmail.get(n.to)
      if (!user) throw new Error(`Demo notices: no user ${n.to}`)
      const at = daysAgo(n.daysAgo)
      await trx('notices').insert({ user_id: user.id, org_id: user.orgId, kind: n.kind, subject: n.subject, body: n.body, link: n.link, read_at: n.read ? at : null, created_at: at })
      await trx('notifications').insert({
        org_id: user.orgId, user_id: user.id, recipient: n.to, kind: n.kind, subject: n.subject, body: n.body, link: n.link,
        status: 'sent', attempts: 1, next_attempt_at: at, sent_at: at, created_at: at,
      })
    }
    const quillhurst = byEmail.get('maker@demo.test')!
    const tried = daysAgo(3)
    await trx('notifications').insert({
      org_id: quillhurst.orgId, user_id: null, recipient: 'cellar@quilhurst.example', kind: 'member.invited',
      subject: 'Olu Brandt invites you to Quillhurst Cider Works on Pomewright', body: 'The invitation link was withdrawn.', link: null,
      status: 'failed', attempts: 5, next_attempt_at: tried, error: 'EENVELOPE: 550 5.1.1 <cellar@quilhurst.example>: mailbox unavailable', created_at: tried,
    })
  })
}
