import type { RouteRecordRaw } from 'vue-router'
import { createRouter, createWebHistory } from '@ionic/vue-router'
import { installGuards } from './guards'

/** The six tabs and the account screens; every page, and the tab frame, loads when first opened. */
export const routes: RouteRecordRaw[] = [
  { path: '/', redirect: '/bench' },
  {
    path: '/',
    // The tab frame loads with the first tab: the sign-in screen needs none of it.
    component: () => import('../views/ShellTabsPage.vue'),
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
  { path: '/field/recipes', name: 'recipes', component: () => import('../views/RecipesPage.vue') },
  { path: '/field/recipes/new', name: 'recipe-new', component: () => import('../views/RecipeEditPage.vue') },
  { path: '/field/recipes/:id', name: 'recipe', component: () => import('../views/RecipePage.vue') },
  { path: '/field/recipes/:id/edit', name: 'recipe-edit', component: () => import('../views/RecipeEditPage.vue') },
  { path: '/field/dial-in/new', name: 'dial-in-new', component: () => import('../views/DialInStartPage.vue') },
  { path: '/field/dial-in/:id', name: 'dial-in', component: () => import('../views/DialInSessionPage.vue') },
  { path: '/field/dial-in/:id/attempt', name: 'dial-in-attempt', component: () => import('../views/DialInAttemptPage.vue') },
  { path: '/crew/members', name: 'team-members', component: () => import('../views/TeamMembersPage.vue') },
  { path: '/crew/attention', name: 'sync-attention', component: () => import('../views/SyncAttentionPage.vue') },
  { path: '/field/trips/new', name: 'trip-new', component: () => import('../views/TripNewPage.vue') },
  { path: '/field/trips/:tripId', name: 'trip', component: () => import('../views/TripPage.vue') },
  { path: '/field/trips/:tripId/lots/new', name: 'lot-new', component: () => import('../views/LotPage.vue') },
  { path: '/field/trips/:tripId/tables/new', name: 'table-new', component: () => import('../views/CuppingTableNewPage.vue') },
  { path: '/field/trips/:tripId/compare', name: 'lot-compare', component: () => import('../views/LotComparePage.vue') },
  { path: '/field/trips/:tripId/import', name: 'offer-import', component: () => import('../views/OfferImportPage.vue') },
  { path: '/field/lots/:lotId', name: 'lot', component: () => import('../views/LotPage.vue') },
  { path: '/field/tables/:tableId', name: 'cupping-table', component: () => import('../views/CuppingTablePage.vue') },
  { path: '/field/score-sheets', name: 'score-sheets', component: () => import('../views/ScoreSheetsPage.vue') },
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
