import type { RouteRecordRaw } from 'vue-router'
import { createRouter, createWebHistory } from '@ionic/vue-router'
import ShellTabsPage from '../views/ShellTabsPage.vue'

/** The five tabs; every page but the tab frame itself is loaded when first opened. */
export const routes: RouteRecordRaw[] = [
  { path: '/', redirect: '/bench' },
  {
    path: '/',
    component: ShellTabsPage,
    children: [
      { path: 'bench', name: 'bench', component: () => import('../views/BenchPage.vue') },
      { path: 'zone', name: 'zone', component: () => import('../views/ZonePage.vue') },
      { path: 'ledger', name: 'ledger', component: () => import('../views/LedgerPage.vue') },
      { path: 'gauges', name: 'gauges', component: () => import('../views/GaugesPage.vue') },
      { path: 'crew', name: 'crew', component: () => import('../views/CrewPage.vue') },
    ],
  },
  { path: '/:pathMatch(.*)*', redirect: '/bench' },
]

export const router = createRouter({
  history: createWebHistory(import.meta.env.BASE_URL),
  routes,
})
