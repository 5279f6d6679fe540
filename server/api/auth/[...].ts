import CredentialsProvider from 'next-auth/providers/credentials'
import { NuxtAuthHandler } from '#auth'
import type { SessionUser } from '#shared/types/auth'
import { authenticate, sessionUserOf, tokenClaims } from '../../services/signIn'
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
        const user = await authenticate(credentials?.email, credentials?.password, String(req.headers?.[CLIENT_ADDRESS_HEADER] ?? 'unknown'))
        return user && { ...user, id: String(user.id) }
      },
    }),
  ],
  callbacks: {
    jwt({ token, user }) {
      // `user` is what authorize answered, on the sign-in request only.
      if (user) Object.assign(token, tokenClaims({ ...(user as unknown as SessionUser), id: Number(user.id) }))
      return token
    },
    session({ session, token }) {
      session.user = sessionUserOf(token) as unknown as typeof session.user
      return session
    },
  },
})
