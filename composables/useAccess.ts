import { decideAccess, type AccessRule } from '#shared/utils/access'

/** Whether the signed-in person passes a rule, asked the same way the server and the page guard ask it. */
export function useAccess() {
  const { user } = useSessionUser()
  const can = (rule: AccessRule) => decideAccess(user.value, rule).ok
  return { user, can }
}
