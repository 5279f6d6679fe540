import CredentialsProvider from 'next-auth/providers/credentials'
import { NuxtAuthHandler } from '#auth'
import type { SessionUser } from '#shared/types/auth'
import { findForSignIn } from '../../repositories/users'
import { recordSignIn } from '../../repositories/signInAttempts'
import { UNUSABLE_HASH, verifyPassword } from '../../utils/passwords'
import { CLIENT_ADDRESS_HEADER } from '../../utils/signInLimit'

// The provider module is CommonJS; under the server bundle its factory sits on `.default`.
const Credentials = (CredentialsProvider as unknown as { default?: typeof CredentialsProvider }).default ?? CredentialsProvider

export default NuxtAuthHandler({
  secret: useRuntimeConfig().authSecret,
  pages: { signIn: '/signin', error: '/signin' },
  session: { strategy: 'jwt', maxAge: 12 * 3600 },
  providers: [
    Credentials({
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials, req) {
        const email = String(credentials?.email ?? '').trim().toLowerCase()
        const password = String(credentials?.password ?? '')
        const address = String(req.headers?.[CLIENT_ADDRESS_HEADER] ?? 'unknown')
        const candidate = email && password ? await findForSignIn(email) : { user: null, passwordHash: null, pendingVerification: false }
        // Compare against a dummy hash when there is no account, so timing does not reveal which e-mails exist.
        const matches = await verifyPassword(password, candidate.passwordHash ?? UNUSABLE_HASH)
        await recordSignIn(email, address, matches && candidate.user !== null)
        if (matches && candidate.pendingVerification) throw new Error('EmailNotVerified')
        if (!matches || !candidate.user) return null
        return { ...candidate.user, id: String(candidate.user.id) }
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      if (user) {
        const u = user as unknown as SessionUser & { id: string }
        Object.assign(token, { id: Number(u.id), orgId: u.orgId, orgKind: u.orgKind, isNursery: u.isNursery, role: u.role, units: u.units, name: u.name })
      }
      return token
    },
    session({ session, token }) {
      const t = token as unknown as SessionUser
      session.user = { id: t.id, email: token.email ?? '', name: t.name, orgId: t.orgId, orgKind: t.orgKind, isNursery: t.isNursery, role: t.role, units: t.units } as typeof session.user
      return session
    },
  },
})
