import { createVuetify, type ThemeDefinition } from 'vuetify'
import 'vuetify/styles'
import '@fontsource/roboto/400.css'
import '@fontsource/roboto/500.css'
import '@fontsource/roboto/700.css'
import { aliases, namedMdi } from './icons'
import { darkPalette, lightPalette, THEME_DARK, THEME_LIGHT, type Palette, type ThemeName } from './palette'

function themeFrom(p: Palette, dark: boolean): ThemeDefinition {
  return {
    dark,
    colors: {
      background: p.background,
      surface: p.surface,
      'surface-muted': p.surfaceMuted,
      'on-surface-muted': p.onSurface,
      primary: p.primary,
      secondary: p.secondary,
      accent: p.accent,
      success: p.success,
      warning: p.warning,
      error: p.error,
      info: p.info,
      'on-surface': p.onSurface,
      'on-background': p.onSurface,
    },
    variables: {
      'border-color': p.border,
      'border-opacity': 1,
      'medium-emphasis-opacity': 0.72,
    },
  }
}

export function createAppVuetify(initialTheme: ThemeName = THEME_LIGHT) {
  return createVuetify({
    theme: {
      defaultTheme: initialTheme,
      themes: { [THEME_LIGHT]: themeFrom(lightPalette, false), [THEME_DARK]: themeFrom(darkPalette, true) },
    },
    icons: { defaultSet: 'mdi', aliases, sets: { mdi: namedMdi } },
    // Dense by default: the people using this read tables of numbers, not marketing cards.
    defaults: {
      VBtn: { rounded: 'md' },
      VCard: { rounded: 'lg', variant: 'flat', border: true },
      VTextField: { density: 'compact', variant: 'outlined' },
      VSelect: { density: 'compact', variant: 'outlined' },
      VList: { density: 'compact' },
      VChip: { size: 'small', rounded: 'md' },
    },
  })
}
