import { acceptHMRUpdate, defineStore } from 'pinia'
import { ref, watch } from 'vue'

/** What the Studio's right-hand pane shows. */
export type StudioPane = 'script' | 'steps'

export const STUDIO_PREFS_KEY = 'gridcue.studio.prefs'

interface SavedPrefs {
  pane: StudioPane
  followStep: boolean
  showTradeTerms: boolean
}

const DEFAULTS: SavedPrefs = { pane: 'script', followStep: true, showTradeTerms: true }

/**
 * The Studio's screen preferences, kept across visits in this browser. UI state only:
 * the outline itself is server data and lives in the view (vue-query) and its composables.
 */
export const useStudioStore = defineStore('studio', () => {
  const saved = readSaved()
  const pane = ref<StudioPane>(saved.pane)
  /** Scroll the script to the current line whenever the step changes. */
  const followStep = ref(saved.followStep)
  /** Show the trade term after the plain-words technique name. */
  const showTradeTerms = ref(saved.showTradeTerms)

  watch([pane, followStep, showTradeTerms], () => {
    const value: SavedPrefs = { pane: pane.value, followStep: followStep.value, showTradeTerms: showTradeTerms.value }
    try {
      localStorage.setItem(STUDIO_PREFS_KEY, JSON.stringify(value))
    } catch {
      // Storage full or blocked: preferences just won't outlive the tab.
    }
  })

  return { pane, followStep, showTradeTerms }
})

function readSaved(): SavedPrefs {
  try {
    const raw = JSON.parse(localStorage.getItem(STUDIO_PREFS_KEY) ?? 'null') as Partial<SavedPrefs> | null
    if (!raw || typeof raw !== 'object') return { ...DEFAULTS }
    return {
      pane: raw.pane === 'steps' ? 'steps' : 'script',
      followStep: typeof raw.followStep === 'boolean' ? raw.followStep : DEFAULTS.followStep,
      showTradeTerms: typeof raw.showTradeTerms === 'boolean' ? raw.showTradeTerms : DEFAULTS.showTradeTerms,
    }
  } catch {
    return { ...DEFAULTS }
  }
}

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useStudioStore, import.meta.hot))
