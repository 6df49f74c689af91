export function useSignOut() {
  const { clear } = useUserSession()
  return async () => {
    await $fetch('/api/auth/logout', { method: 'POST' })
    await clear()
    await navigateTo('/login')
  }
}

/** Ends every session of the signed-in person (other browsers and devices too), then this one. */
export function useSignOutEverywhere() {
  const { clear } = useUserSession()
  return async () => {
    await $fetch('/api/auth/logout-everywhere', { method: 'POST', body: { everywhere: true } })
    await clear()
    await navigateTo('/login')
  }
}
