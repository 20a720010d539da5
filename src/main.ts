import { VueQueryPlugin } from '@tanstack/vue-query'
import { createPinia } from 'pinia'
import { createApp } from 'vue'
import App from './App.vue'
import { watchNetwork } from './offline/network'
import { adoptPageBoot } from './pageBoot'
import { queryClient } from './queryClient'
import router from './router'
import { useAuthStore } from './stores/auth'
import './assets/main.css'

watchNetwork()
const pinia = createPinia()
adoptPageBoot(pinia)
const app = createApp(App)
app.use(pinia)
app.use(router)
app.use(VueQueryPlugin, { queryClient })
app.mount('#app')
// Catches logged offline wait on the phone; they are sent whenever the network is there.
void import('./offline/catch-queue').then((m) =>
  m.sendWhenOnline(() => useAuthStore(pinia).user?.id ?? null),
)
// The service worker's code is not needed for the first page: it registers once the page is up.
if (import.meta.env.PROD && 'serviceWorker' in navigator)
  window.addEventListener(
    'load',
    () =>
      void import('./offline/register').then((m) =>
        m.registerServiceWorker(router, () => useAuthStore(pinia).signedIn),
      ),
  )
