// Tree-shaken ECharts. Import this only from chart pages/components (lazy routes) so the ~500 kB stays out of
// the entry chunk:  import { VChart, chartThemeName } from '@/plugins/echarts'
import { use, registerTheme } from 'echarts/core'
import { HeatmapChart, LineChart, ScatterChart } from 'echarts/charts'
import {
  DataZoomComponent,
  GraphicComponent,
  GridComponent,
  LegendComponent,
  MarkAreaComponent,
  MarkLineComponent,
  TitleComponent,
  ToolboxComponent,
  TooltipComponent,
  VisualMapComponent,
} from 'echarts/components'
import { CanvasRenderer } from 'echarts/renderers'
import VChart from 'vue-echarts'
import { darkPalette, lightPalette, THEME_DARK, type Palette, type ThemeName } from './palette'

use([
  HeatmapChart,
  LineChart,
  ScatterChart,
  GridComponent,
  TooltipComponent,
  LegendComponent,
  MarkLineComponent,
  MarkAreaComponent,
  VisualMapComponent,
  DataZoomComponent,
  GraphicComponent,
  TitleComponent,
  ToolboxComponent,
  CanvasRenderer,
])

function chartTheme(p: Palette) {
  const axis = {
    axisLine: { lineStyle: { color: p.border } },
    axisTick: { lineStyle: { color: p.border } },
    axisLabel: { color: p.onSurface },
    splitLine: { lineStyle: { color: p.border, opacity: 0.5 } },
    nameTextStyle: { color: p.onSurface },
  }
  return {
    color: [...p.series],
    backgroundColor: 'transparent',
    textStyle: { fontFamily: 'Roboto, sans-serif', color: p.onSurface },
    title: { textStyle: { color: p.onSurface, fontWeight: 500, fontSize: 14 } },
    legend: { textStyle: { color: p.onSurface } },
    valueAxis: axis,
    categoryAxis: axis,
    logAxis: axis,
    timeAxis: axis,
    tooltip: { backgroundColor: p.surface, borderColor: p.border, textStyle: { color: p.onSurface } },
  }
}

registerTheme('sonoweave-light', chartTheme(lightPalette))
registerTheme('sonoweave-dark', chartTheme(darkPalette))

/** The ECharts theme matching a Vuetify theme; pass as <VChart :theme="chartThemeName(prefs.theme)">. */
export const chartThemeName = (t: ThemeName): string => (t === THEME_DARK ? 'sonoweave-dark' : 'sonoweave-light')

export { VChart }
