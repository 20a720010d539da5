import { VueQueryPlugin } from '@tanstack/vue-query'
import { createPinia } from 'pinia'
import { createApp } from 'vue'
import App from './App.vue'
import { adoptPageBoot } from './pageBoot'
import { queryClient } from './queryClient'
import router from './router'
import './assets/main.css'

const pinia = createPinia()
adoptPageBoot(pinia)
const app = createApp(App)
app.use(pinia)
app.use(router)
app.use(VueQueryPlugin, { queryClient })
app.mount('#app')
