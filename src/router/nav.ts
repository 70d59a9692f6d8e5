import type { Role } from '#shared/schemas/user'
import { CLINICAL_ROLES } from './routes'

export interface NavItem {
  label: string
  icon: string
  routeName: string
  /** Omitted means any signed-in user. */
  roles?: Role[]
}

export const navItems: NavItem[] = [
  { label: 'Home', icon: 'mdi-home-outline', routeName: 'home' },
  { label: 'Teams', icon: 'mdi-account-group-outline', routeName: 'teams', roles: CLINICAL_ROLES },
  { label: 'Accounts', icon: 'mdi-shield-account-outline', routeName: 'accounts', roles: ['admin'] },
]

/** The nav items a user with these roles may open. */
export function navItemsFor(userRoles: readonly Role[], items: NavItem[] = navItems): NavItem[] {
  return items.filter((item) => !item.roles || item.roles.some((role) => userRoles.includes(role)))
}
