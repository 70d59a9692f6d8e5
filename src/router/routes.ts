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
  // Invitation and reset e-mails link to /invitation and /reset-password (with the token in the fragment).
  { path: '/set-password', alias: ['/invitation', '/reset-password'], name: 'set-password', component: () => import('@/views/SetPasswordView.vue'), meta: { public: true, title: 'Set your password' } },
  { path: '/forgot-password', name: 'password-reset', component: () => import('@/views/PasswordResetView.vue'), meta: { public: true, title: 'Forgot password' } },
  { path: '/', name: 'home', component: () => import('@/views/HomeView.vue'), meta: { title: 'Home' } },
  { path: '/record/:draftId?', name: 'record', component: () => import('@/views/BedsideView.vue'), meta: { roles: ['resident', 'attending'], title: 'Record exam' } },
  { path: '/exams', name: 'exams', component: () => import('@/views/ExamLogView.vue'), meta: { roles: CLINICAL_ROLES, title: 'Exam log' } },
  { path: '/exams/:id', name: 'exam-detail', component: () => import('@/views/ExamDetailView.vue'), meta: { roles: CLINICAL_ROLES, title: 'Exam' } },
  { path: '/patients/:code', name: 'patient-timeline', component: () => import('@/views/PatientTimelineView.vue'), meta: { roles: ['resident', 'attending'], title: 'Patient over time' } },
  { path: '/signoff', name: 'signoff-queue', component: () => import('@/views/SignoffQueueView.vue'), meta: { roles: ['attending'], title: 'Sign-off queue' } },
  { path: '/signoff/:id', name: 'exam-review', component: () => import('@/views/ExamReviewView.vue'), meta: { roles: ['attending'], title: 'Review exam' } },
  { path: '/agreement', name: 'agreement', component: () => import('@/views/AgreementView.vue'), meta: { roles: CLINICAL_ROLES, title: 'Agreement' } },
  { path: '/agreement/accuracy', name: 'accuracy', component: () => import('@/views/AccuracyView.vue'), meta: { roles: ['attending', 'educator'], title: 'Accuracy against measured pressures' } },
  { path: '/my-agreement', name: 'my-agreement', component: () => import('@/views/MyAgreementView.vue'), meta: { roles: ['resident', 'attending'], title: 'My agreement' } },
  { path: '/rounds', name: 'rounds', component: () => import('@/views/RoundsView.vue'), meta: { roles: CLINICAL_ROLES, title: 'Calibration rounds' } },
  { path: '/rounds/:id', name: 'round-detail', component: () => import('@/views/RoundDetailView.vue'), meta: { roles: CLINICAL_ROLES, title: 'Calibration round' } },
  { path: '/teams', name: 'teams', component: () => import('@/views/TeamsView.vue'), meta: { roles: CLINICAL_ROLES, title: 'Teams' } },
  { path: '/admin/accounts', name: 'accounts', component: () => import('@/views/AccountsView.vue'), meta: { roles: ['admin'], title: 'Accounts' } },
  { path: '/admin/roster', name: 'roster-import', component: () => import('@/views/RosterImportView.vue'), meta: { roles: ['admin'], title: 'Roster import' } },
  { path: '/admin/audit', name: 'audit-trail', component: () => import('@/views/AuditTrailView.vue'), meta: { roles: ['admin'], title: 'Audit trail' } },
  { path: '/admin/mailbox', name: 'mailbox', component: () => import('@/views/MailboxView.vue'), meta: { roles: ['admin'], title: 'Mailbox' } },
  { path: '/admin/settings', name: 'settings', component: () => import('@/views/SettingsView.vue'), meta: { roles: ['admin'], title: 'Settings' } },
  { path: '/device', name: 'device', component: () => import('@/views/AboutView.vue'), meta: { title: 'This device' } },
  { path: '/sync/conflicts', name: 'sync-conflicts', component: () => import('@/views/SyncConflictView.vue'), meta: { roles: ['resident', 'attending'], title: 'Needs your attention' } },
  { path: '/not-allowed', name: 'not-allowed', component: () => import('@/views/NotAllowedView.vue'), meta: { title: 'Not allowed' } },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue'), meta: { public: true, title: 'Not found' } },
]
