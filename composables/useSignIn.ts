// Signs in with e-mail and password through the credentials provider, keeping the server's own
// answer (a 429 while sign-in is limited, or which check failed) for the page to show.
const REASONS: Record<string, string> = {
  CredentialsSignin: 'That e-mail and password do not match an account.',
  EmailNotVerified: 'Confirm your e-mail address first: follow the link we sent you. Lost it? Open an account again with the same e-mail for a new link.',
}

export function useSignIn() {
  const { getCsrfToken, getSession } = useAuth()
  const pending = ref(false)
  const error = ref<string | null>(null)

  async function signInWithPassword(email: string, password: string, callbackUrl = '/'): Promise<boolean> {
    pending.value = true
    error.value = null
    try {
      const csrfToken = await getCsrfToken()
      const body = new URLSearchParams({ email, password, csrfToken: csrfToken ?? '', callbackUrl, json: 'true' })
      // A refused sign-in answers 401 with the reason in the returned URL; read it rather than throw.
      const res = await $fetch.raw<{ url?: string, message?: string }>('/api/auth/callback/credentials', {
        method: 'POST', body, headers: { 'content-type': 'application/x-www-form-urlencoded' }, ignoreResponseError: true,
      })
      const answer = res._data
      const reason = answer?.url ? new URL(answer.url, window.location.origin).searchParams.get('error') : null
      if (res.status === 429 || !answer?.url) {
        error.value = answer?.message ?? 'Sign-in is not available just now. Try again shortly.'
        return false
      }
      if (reason) {
        error.value = REASONS[reason] ?? 'Sign-in failed. Try again.'
        return false
      }
      await getSession()
      return true
    }
    catch {
      error.value = 'Sign-in is not available just now. Check your connection and try again.'
      return false
    }
    finally {
      pending.value = false
    }
  }

  return { signInWithPassword, pending, error }
}
