import type { AppContext, Component } from 'vue'
import { getCurrentInstance } from 'vue'

/**
 * Returns a function that opens a Vue component in an Ionic modal. Call it in setup: the component
 * is rendered with the app's context, so it sees the same stores, router and Ionic config. The
 * modal's web component loads with the first modal, not with the screen that may open one.
 */
export function useModal(): (component: Component, props?: Record<string, unknown>) => Promise<void> {
  const appContext: AppContext | null = getCurrentInstance()?.appContext ?? null
  return async (component, props = {}) => (await import('./modal-element')).openInModal(appContext, component, props)
}
