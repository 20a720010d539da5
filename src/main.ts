import { VueQueryPlugin } from '@tanstack/vue-query'
import { createPinia } from 'pinia'
import { createApp } from 'vue'
import { dateTimeFormat } from '@shared/time'
import App from './App.vue'
import { queryClient } from './queryClient'
import router from './router'
import './assets/main.css'

const app = createApp(App)
app.use(createPinia())
app.use(router)
app.use(VueQueryPlugin, { queryClient })
app.mount('#app')
// The first Intl.DateTimeFormat loads the runtime's locale data, tens of milliseconds on a phone.
// Pay that now, while the first requests are in flight, not when a page's data arrives to render.
dateTimeFormat({ hour: 'numeric' })
