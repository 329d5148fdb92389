import { defineStore } from 'pinia'
import { computed, ref, watch } from 'vue'
import { THEME_DARK, THEME_LIGHT, type ThemeName } from '@/plugins/palette'

const THEME_KEY = 'sonoweave.theme'

function readStoredTheme(): ThemeName | null {
  try {
    const v = globalThis.localStorage?.getItem(THEME_KEY)
    return v === THEME_LIGHT || v === THEME_DARK ? v : null
  } catch {
    return null // storage blocked (private mode, sandboxed frame): fall back to the system preference
  }
}

function systemTheme(): ThemeName {
  const dark = globalThis.matchMedia?.('(prefers-color-scheme: dark)').matches
  return dark ? THEME_DARK : THEME_LIGHT
}

/** Per-browser preferences. Only the theme so far; it outlives the session on purpose. */
export const usePrefsStore = defineStore('prefs', () => {
  const theme = ref<ThemeName>(readStoredTheme() ?? systemTheme())

  watch(theme, (name) => {
    try {
      globalThis.localStorage?.setItem(THEME_KEY, name)
    } catch {
      // Not persisting is fine; the choice still holds for this tab.
    }
  })

  const isDark = computed(() => theme.value === THEME_DARK)
  function toggleTheme() {
    theme.value = isDark.value ? THEME_LIGHT : THEME_DARK
  }

  return { theme, isDark, toggleTheme }
})
