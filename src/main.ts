import { IonicVue } from '@ionic/vue'
import { createPinia } from 'pinia'
import { createApp } from 'vue'
import App from './App.vue'
import { router } from './router'
import { useSettingsStore } from './stores/settings'

import '@ionic/vue/css/core.css'
import '@ionic/vue/css/normalize.css'
import '@ionic/vue/css/structure.css'
import '@ionic/vue/css/typography.css'
import '@ionic/vue/css/palettes/dark.class.css'
// Only the weights and the latin subset in use; the files ship with the app, nothing is fetched.
import '@fontsource/nunito/latin-400.css'
import '@fontsource/nunito/latin-700.css'
import '@fontsource/nunito/latin-800.css'
import './theme/utilities.css'
import './theme/variables.css'

const app = createApp(App).use(IonicVue).use(createPinia()).use(router)
useSettingsStore().applyTheme()

router.isReady().then(() => app.mount('#app'))
