import type { RouteRecordRaw } from 'vue-router'
import { createRouter, createWebHistory } from '@ionic/vue-router'
import ShellTabsPage from '../views/ShellTabsPage.vue'
import { installGuards } from './guards'

/** The six tabs and the account screens; every page but the tab frame loads when first opened. */
export const routes: RouteRecordRaw[] = [
  { path: '/', redirect: '/bench' },
  {
    path: '/',
    component: ShellTabsPage,
    children: [
      { path: 'bench', name: 'bench', component: () => import('../views/BenchPage.vue') },
      { path: 'field', name: 'field', component: () => import('../views/FieldPage.vue') },
      { path: 'zone', name: 'zone', component: () => import('../views/ZonePage.vue') },
      { path: 'ledger', name: 'ledger', component: () => import('../views/LedgerPage.vue') },
      { path: 'gauges', name: 'gauges', component: () => import('../views/GaugesPage.vue') },
      { path: 'crew', name: 'crew', component: () => import('../views/CrewPage.vue') },
    ],
  },
  { path: '/field/events/:id', name: 'judging-event', component: () => import('../views/JudgingEventPage.vue') },
  { path: '/field/events/:eventId/rounds/new', name: 'round-new', component: () => import('../views/RoundSetupPage.vue') },
  { path: '/field/rounds/:id', name: 'round-board', component: () => import('../views/RoundBoardPage.vue') },
  { path: '/field/rounds/:id/setup', name: 'round-setup', component: () => import('../views/RoundSetupPage.vue') },
  { path: '/field/rounds/:id/chart', name: 'round-chart', component: () => import('../views/RoundChartPage.vue') },
  { path: '/field/rounds/:id/sign-off', name: 'round-sign-off', component: () => import('../views/RoundSignOffPage.vue') },
  { path: '/field/rounds/:id/labels', name: 'round-labels', component: () => import('../views/RoundLabelsPage.vue') },
  { path: '/field/rounds/:id/results', name: 'round-results', component: () => import('../views/RoundResultsPage.vue') },
  { path: '/gauges/:id', name: 'instrument', component: () => import('../views/InstrumentPage.vue') },
  { path: '/ledger/:id', name: 'brew', component: () => import('../views/BrewDetailPage.vue') },
  { path: '/ledger/:id/edit', name: 'brew-edit', component: () => import('../views/BrewEditPage.vue') },
  { path: '/crew/members', name: 'team-members', component: () => import('../views/TeamMembersPage.vue') },
  { path: '/crew/attention', name: 'sync-attention', component: () => import('../views/SyncAttentionPage.vue') },
  { path: '/join', name: 'join', component: () => import('../views/JoinTeamPage.vue') },
  { path: '/sign-in', name: 'sign-in', component: () => import('../views/SignInPage.vue'), meta: { guest: true } },
  { path: '/sign-up', name: 'sign-up', component: () => import('../views/SignUpPage.vue'), meta: { guest: true } },
  { path: '/forgot-password', name: 'forgot-password', component: () => import('../views/ForgotPasswordPage.vue'), meta: { guest: true } },
  { path: '/reset-password', name: 'reset-password', component: () => import('../views/ResetPasswordPage.vue'), meta: { guest: true } },
  { path: '/:pathMatch(.*)*', redirect: '/bench' },
]

export const router = createRouter({
  history: createWebHistory(import.meta.env.BASE_URL),
  routes,
})
installGuards(router)
