import type { RouteLocationNormalized } from 'vue-router'
import { useSessionStore } from '@/stores/session'

/** Sends visitors to sign-in and users without the route's roles to not-allowed. */
export async function accessGuard(to: RouteLocationNormalized) {
  const session = useSessionStore()
  await session.restore()
  if (to.meta.public) return true
  if (!session.signedIn) return { name: 'sign-in', query: { redirect: to.fullPath } }
  const roles = to.meta.roles
  if (roles && !session.hasRole(...roles)) return { name: 'not-allowed' }
  return true
}
