import { acceptHMRUpdate, defineStore } from 'pinia'
import { ref, watch } from 'vue'

/** Colour schemes of the prompter's text: our own three, for a dim studio, a bright room and a glass. */
export const PROMPTER_SCHEMES = ['light-on-dark', 'dark-on-light', 'amber-on-black'] as const
export type PrompterScheme = (typeof PROMPTER_SCHEMES)[number]

export const PROMPTER_SCHEME_NAMES: Record<PrompterScheme, string> = {
  'light-on-dark': 'White on black',
  'dark-on-light': 'Black on white',
  'amber-on-black': 'Amber on black',
}

/** Text sizes of the current line, in rem: from a tablet held close to a monitor across the room. */
export const PROMPTER_TEXT_SIZES = [1.5, 2, 2.5, 3, 3.75, 4.5] as const

const PROMPTER_PREFS_KEY = 'gridcue.prompter.prefs'

interface SavedPrefs {
  mirrored: boolean
  sizeIndex: number
  scheme: PrompterScheme
  autoAdvance: boolean
}

const DEFAULTS: SavedPrefs = { mirrored: false, sizeIndex: 2, scheme: 'light-on-dark', autoAdvance: false }

/** The prompter's screen settings, kept in this browser: a presenter sets up their glass once. */
export const usePrompterStore = defineStore('prompter', () => {
  const saved = readSaved()
  const mirrored = ref(saved.mirrored)
  const sizeIndex = ref(saved.sizeIndex)
  const scheme = ref<PrompterScheme>(saved.scheme)
  const autoAdvance = ref(saved.autoAdvance)

  function bigger(): void {
    sizeIndex.value = Math.min(PROMPTER_TEXT_SIZES.length - 1, sizeIndex.value + 1)
  }
  function smaller(): void {
    sizeIndex.value = Math.max(0, sizeIndex.value - 1)
  }
  function nextScheme(): void {
    scheme.value = PROMPTER_SCHEMES[(PROMPTER_SCHEMES.indexOf(scheme.value) + 1) % PROMPTER_SCHEMES.length]
  }

  watch([mirrored, sizeIndex, scheme, autoAdvance], () => {
    const value: SavedPrefs = { mirrored: mirrored.value, sizeIndex: sizeIndex.value, scheme: scheme.value, autoAdvance: autoAdvance.value }
    try {
      localStorage.setItem(PROMPTER_PREFS_KEY, JSON.stringify(value))
    } catch {
      // storage full or blocked: the settings just won't outlive the tab
    }
  })

  return { mirrored, sizeIndex, scheme, autoAdvance, bigger, smaller, nextScheme }
})

function readSaved(): SavedPrefs {
  try {
    const raw = JSON.parse(localStorage.getItem(PROMPTER_PREFS_KEY) ?? 'null') as Partial<SavedPrefs> | null
    if (!raw || typeof raw !== 'object') return { ...DEFAULTS }
    const size = raw.sizeIndex
    return {
      mirrored: raw.mirrored === true,
      sizeIndex: typeof size === 'number' && Number.isInteger(size) && size >= 0 && size < PROMPTER_TEXT_SIZES.length ? size : DEFAULTS.sizeIndex,
      scheme: PROMPTER_SCHEMES.find((s) => s === raw.scheme) ?? DEFAULTS.scheme,
      autoAdvance: raw.autoAdvance === true,
    }
  } catch {
    return { ...DEFAULTS }
  }
}

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(usePrompterStore, import.meta.hot))
