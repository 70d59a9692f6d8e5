import type { Role } from '#shared/schemas/user'
import { CLINICAL_ROLES } from './routes'

export interface NavItem {
  label: string
  icon: string
  routeName: string
  /** Omitted means any signed-in user. */
  roles?: Role[]
  /** A live count shown beside the label. */
  badge?: 'signoff-count'
}

export const navItems: NavItem[] = [
  { label: 'Home', icon: 'mdi-home-outline', routeName: 'home' },
  { label: 'Record an exam', icon: 'mdi-clipboard-pulse-outline', routeName: 'record', roles: ['resident', 'attending'] },
  { label: 'Exam log', icon: 'mdi-clipboard-text-clock-outline', routeName: 'exams', roles: CLINICAL_ROLES },
  { label: 'Sign-off queue', icon: 'mdi-draw-pen', routeName: 'signoff-queue', roles: ['attending'], badge: 'signoff-count' },
  { label: 'Agreement', icon: 'mdi-chart-scatter-plot', routeName: 'agreement', roles: CLINICAL_ROLES },
  { label: 'My agreement', icon: 'mdi-school-outline', routeName: 'my-agreement', roles: ['resident', 'attending'] },
  { label: 'Calibration rounds', icon: 'mdi-target-account', routeName: 'rounds', roles: CLINICAL_ROLES },
  { label: 'Teams', icon: 'mdi-account-group-outline', routeName: 'teams', roles: CLINICAL_ROLES },
  { label: 'Accounts', icon: 'mdi-shield-account-outline', routeName: 'accounts', roles: ['admin'] },
  { label: 'Audit trail', icon: 'mdi-history', routeName: 'audit-trail', roles: ['admin'] },
  { label: 'Mailbox', icon: 'mdi-email-outline', routeName: 'mailbox', roles: ['admin'] },
  { label: 'Settings', icon: 'mdi-tune-variant', routeName: 'settings', roles: ['admin'] },
  { label: 'This device', icon: 'mdi-cellphone-cog', routeName: 'device' },
]

/** The nav items a user with these roles may open. */
export function navItemsFor(userRoles: readonly Role[], items: NavItem[] = navItems): NavItem[] {
  return items.filter((item) => !item.roles || item.roles.some((role) => userRoles.includes(role)))
}
