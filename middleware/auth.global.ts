// Every page needs a signed-in person unless it says `public: true`; pages that
// name `roles` refuse everyone else. The server checks again on every API call.
import { homeFor, roleAllowed } from '#shared/auth/roles'

export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn, user } = useUserSession()
  if (to.meta.public) {
    if (loggedIn.value && user.value && to.path === '/login') return navigateTo(homeFor(user.value.role))
    return
  }
  if (!loggedIn.value || !user.value) {
    return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  }
  if (to.meta.roles && !roleAllowed(user.value.role, to.meta.roles)) {
    return abortNavigation(createError({
      statusCode: 403,
      statusMessage: 'Forbidden',
      message: 'This page is not available to your role.',
      fatal: true,
    }))
  }
})
