export function useSignOut() {
  const { clear } = useUserSession()
  return async () => {
    await $fetch('/api/auth/logout', { method: 'POST' })
    await clear()
    await navigateTo('/login')
  }
}
