// first: zod's settings apply to schemas as they are built, and the imports below build them
import '@shared/schemas/zod-config'
import { createApp } from 'vue'
import EpisodeApp from './EpisodeApp.vue'
import { loadEpisode } from './load'
import '@/assets/main.css'
import './episode.css'

// The server's HTML stays until the data is in hand, then the app takes over with the same content.
void loadEpisode().then((start) => {
  if (start) createApp(EpisodeApp, { start }).mount('#episode')
})
