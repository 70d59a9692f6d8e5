import type { RouteRecordRaw } from 'vue-router'
import type { Role } from '#shared/schemas/user'

declare module 'vue-router' {
  interface RouteMeta {
    roles?: Role[]
    public?: boolean
    title?: string
  }
}

export const CLINICAL_ROLES: Role[] = ['resident', 'attending', 'educator']

export const routes: RouteRecordRaw[] = [
  { path: '/sign-in', name: 'sign-in', component: () => import('@/views/SignInView.vue'), meta: { public: true, title: 'Sign in' } },
  { path: '/', name: 'home', component: () => import('@/views/HomeView.vue'), meta: { title: 'Home' } },
  { path: '/teams', name: 'teams', component: () => import('@/views/TeamsView.vue'), meta: { roles: CLINICAL_ROLES, title: 'Teams' } },
  { path: '/admin/accounts', name: 'accounts', component: () => import('@/views/AccountsView.vue'), meta: { roles: ['admin'], title: 'Accounts' } },
  { path: '/not-allowed', name: 'not-allowed', component: () => import('@/views/NotAllowedView.vue'), meta: { title: 'Not allowed' } },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue'), meta: { public: true, title: 'Not found' } },
]
