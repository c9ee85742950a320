// first: zod's settings apply to schemas as they are built, and the imports below build them
import '@shared/schemas/zod-config'
import { createApp } from 'vue'
import { createPinia } from 'pinia'
import { createWebHistory } from 'vue-router'
import PrimeVue from 'primevue/config'
import { VueQueryPlugin } from '@tanstack/vue-query'
import App from './App.vue'
import { createQueryClient } from './api/queryClient'
import { createAppRouter } from './router'
import { gridcuePreset, themeOptions } from './theme'
import './assets/main.css'

createApp(App)
  .use(createPinia())
  .use(createAppRouter(createWebHistory()))
  .use(PrimeVue, { theme: { preset: gridcuePreset, options: themeOptions } })
  .use(VueQueryPlugin, { queryClient: createQueryClient() })
  .mount('#app')
