// Vuetify icon set that draws 'mdi-…' names as inline SVG paths (ICON_PATHS), and Vuetify's own aliases
// ($close, $checkboxOn, …) from its SVG alias table. No icon font is loaded.
import { h } from 'vue'
import type { IconProps, IconSet } from 'vuetify'
import { aliases, mdi as svgIcons } from 'vuetify/iconsets/mdi-svg'
import { ICON_PATHS } from './icon-paths'

export function iconPath(name: unknown): unknown {
  return typeof name === 'string' && name in ICON_PATHS ? ICON_PATHS[name] : name
}

export const namedMdi: IconSet = {
  component: (props: IconProps) => h(svgIcons.component, { ...props, icon: iconPath(props.icon) as IconProps['icon'] }),
}

export { aliases }
