// One palette for Vuetify and the charts, so a map drawn on a card sits in the same colours as the card.
// Light: cool paper with deep-teal ink and a copper accent. Dark: blue-black ink, sea-glass teal, amber.

export const THEME_LIGHT = 'sonoweaveLight'
export const THEME_DARK = 'sonoweaveDark'
export type ThemeName = typeof THEME_LIGHT | typeof THEME_DARK

export interface Palette {
  background: string
  surface: string
  surfaceMuted: string
  primary: string
  secondary: string
  accent: string
  success: string
  warning: string
  error: string
  info: string
  onSurface: string
  border: string
  /** Series colours in the order charts use them: pump, Stokes, acoustic, then extras. */
  series: readonly string[]
}

export const lightPalette: Palette = {
  background: '#eef1f0',
  surface: '#fbfcfb',
  surfaceMuted: '#e3e8e7',
  primary: '#0f4c55',
  secondary: '#31404a',
  accent: '#9e5423',
  success: '#2f6f4e',
  warning: '#9a6a12',
  error: '#a3372b',
  info: '#2e5f86',
  onSurface: '#1b2529',
  border: '#c7d0cf',
  series: ['#0f4c55', '#c06a2b', '#6a5a9c', '#2f6f4e', '#8a4a63'],
}

export const darkPalette: Palette = {
  background: '#0d1417',
  surface: '#141e22',
  surfaceMuted: '#1b282d',
  primary: '#6cc0b8',
  secondary: '#a9bcc4',
  accent: '#e3a25a',
  success: '#7cc39a',
  warning: '#e0b45c',
  error: '#ec8677',
  info: '#85b2d9',
  onSurface: '#dde6e6',
  border: '#2a3a40',
  series: ['#6cc0b8', '#e3a25a', '#b4a3e6', '#7cc39a', '#e39ab8'],
}

export const paletteFor = (name: ThemeName): Palette => (name === THEME_DARK ? darkPalette : lightPalette)
