import { definePreset } from '@primeuix/themes'
import Aura from '@primeuix/themes/aura'

/**
 * Gridcue's PrimeVue preset: Aura's structure with our own colours.
 * Primary is a deep-teal scale built around #0F766E (the grid's "deduced" colour) at 600, so white text on a
 * primary button passes WCAG AA (5.5:1). Surfaces are slate.
 */
export const gridcuePreset = definePreset(Aura, {
  primitive: {
    // Our own scale (not Aura's teal), so nothing else in the preset changes with it.
    brand: {
      50: '#effaf8',
      100: '#d5f1ec',
      200: '#abe2d9',
      300: '#78cbbf',
      400: '#43ad9f',
      500: '#1b9083',
      600: '#0f766e',
      700: '#0d5f59',
      800: '#0c4d49',
      900: '#0b3f3c',
      950: '#052624',
    },
  },
  semantic: {
    primary: {
      50: '{brand.50}', 100: '{brand.100}', 200: '{brand.200}', 300: '{brand.300}', 400: '{brand.400}', 500: '{brand.500}',
      600: '{brand.600}', 700: '{brand.700}', 800: '{brand.800}', 900: '{brand.900}', 950: '{brand.950}',
    },
    focusRing: { width: '2px', style: 'solid', color: '{primary.600}', offset: '2px', shadow: 'none' },
    formField: {
      // Aura relies on a border-colour change alone; a real ring is easier to see.
      focusRing: { width: '2px', style: 'solid', color: '{primary.600}', offset: '1px', shadow: 'none' },
    },
    colorScheme: {
      light: {
        surface: {
          0: '#ffffff', 50: '{slate.50}', 100: '{slate.100}', 200: '{slate.200}', 300: '{slate.300}', 400: '{slate.400}',
          500: '{slate.500}', 600: '{slate.600}', 700: '{slate.700}', 800: '{slate.800}', 900: '{slate.900}', 950: '{slate.950}',
        },
        primary: { color: '{primary.600}', contrastColor: '#ffffff', hoverColor: '{primary.700}', activeColor: '{primary.800}' },
        highlight: { background: '{primary.50}', focusBackground: '{primary.100}', color: '{primary.800}', focusColor: '{primary.900}' },
        formField: { invalidBorderColor: '#be123c', invalidPlaceholderColor: '#be123c' },
        text: { color: '#1f2430', hoverColor: '#1f2430', mutedColor: '{slate.600}', hoverMutedColor: '{slate.700}' },
      },
    },
  },
  components: {
    // Aura's message text (yellow-600, red-600 on their tints) falls under WCAG AA; ours are darker, and info is teal.
    message: {
      colorScheme: {
        light: {
          info: messageTone('{brand.50}', '{brand.200}', '{brand.800}'),
          warn: messageTone('#fffbeb', '#fde68a', '#854d0e'),
          error: messageTone('#fff1f2', '#fecdd3', '#9f1239'),
        },
      },
    },
    button: {
      colorScheme: {
        light: {
          // The outlined secondary button (Sign out) reads too faint in Aura's slate-500.
          outlined: { secondary: { borderColor: '{surface.300}', color: '{surface.700}' } },
        },
      },
    },
  },
})

function messageTone(background: string, border: string, color: string) {
  return {
    background,
    borderColor: border,
    color,
    closeButton: { hoverBackground: border, focusRing: { color, shadow: 'none' } },
    outlined: { color, borderColor: color },
    simple: { color },
  }
}

/** Light only for now: our grid palette and page CSS have no dark variant yet, so PrimeVue must not switch alone. */
export const themeOptions = { darkModeSelector: false, cssLayer: false } as const
