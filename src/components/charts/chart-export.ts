// Charts as figures for a paper: the chart's own ECharts option drawn again off screen by the SVG renderer at a
// journal size (one column 8.5 cm, a full page 17 cm), always in the light theme on white, with 8 pt text; SVG
// as drawn, PDF by converting that SVG to vector PDF (svg2pdf.js on jsPDF). One SVG unit is one point, so
// the file's physical size is exact.
import { init, use } from 'echarts/core'
import { SVGRenderer } from 'echarts/renderers'
import { chartThemeName } from '@/plugins/echarts'
import { THEME_LIGHT } from '@/plugins/palette'

use([SVGRenderer])

export type FigureWidth = 'column' | 'page'
export type FigureFormat = 'svg' | 'pdf'

/** Journal widths (cm): a single column and a full page width. */
export const FIGURE_WIDTH_CM: Record<FigureWidth, number> = { column: 8.5, page: 17 }
const PT_PER_CM = 72 / 2.54
const FONT_PT = 8

type Option = Record<string, unknown>
/** The size the figure is drawn at (points), for options that place things by coordinates. */
export interface FigureSize {
  widthPt: number
  heightPt: number
}
export type FigureOption = Option | ((size: FigureSize) => Option)

/** The option with journal text sizes, no interaction parts and no animation. */
function forPaper(option: Option): Option {
  const axes = (a: unknown) =>
    (Array.isArray(a) ? a : a ? [a] : []).map((x: Option) => ({
      ...x,
      axisLabel: { ...(x.axisLabel as Option), fontSize: FONT_PT },
      nameTextStyle: { ...(x.nameTextStyle as Option), fontSize: FONT_PT },
    }))
  const { toolbox: _toolbox, dataZoom, tooltip: _tooltip, ...rest } = option
  // The zoomed view on screen becomes the figure's x range (the zoom slider itself is left out).
  const zoom = (Array.isArray(dataZoom) ? dataZoom : dataZoom ? [dataZoom] : []).find((z: Option) => typeof z.startValue === 'number' && typeof z.endValue === 'number') as Option | undefined
  const x = axes(option.xAxis)
  if (zoom && x[0]) Object.assign(x[0], { min: zoom.startValue, max: zoom.endValue })
  return {
    ...rest,
    animation: false,
    backgroundColor: '#ffffff',
    textStyle: { fontFamily: 'Helvetica, Arial, sans-serif', fontSize: FONT_PT },
    ...(option.xAxis ? { xAxis: Array.isArray(option.xAxis) ? x : x[0] } : {}),
    ...(option.yAxis ? { yAxis: axes(option.yAxis) } : {}),
    ...(option.legend ? { legend: { ...(option.legend as Option), textStyle: { ...((option.legend as Option).textStyle as Option), fontSize: FONT_PT } } } : {}),
  }
}

export interface Figure {
  svg: string
  widthPt: number
  heightPt: number
  widthCm: number
  heightCm: number
}

/** The chart drawn as SVG at the width asked for; height = width × aspect. */
export function renderFigure(option: FigureOption, width: FigureWidth, aspect = 0.62): Figure {
  const widthCm = FIGURE_WIDTH_CM[width]
  const heightCm = Number((widthCm * aspect).toFixed(2))
  const widthPt = Math.round(widthCm * PT_PER_CM)
  const heightPt = Math.round(heightCm * PT_PER_CM)
  const chart = init(null, chartThemeName(THEME_LIGHT), { renderer: 'svg', ssr: true, width: widthPt, height: heightPt })
  try {
    chart.setOption(forPaper(typeof option === 'function' ? option({ widthPt, heightPt }) : option))
    let svg = chart.renderToSVGString()
    // Physical size on the root element; the drawing keeps its point coordinates through the viewBox.
    svg = svg.replace(/<svg([^>]*?)\swidth="[^"]*"\s+height="[^"]*"/, `<svg$1 width="${widthCm}cm" height="${heightCm}cm"`)
    if (!/<svg[^>]*viewBox=/.test(svg)) svg = svg.replace('<svg', `<svg viewBox="0 0 ${widthPt} ${heightPt}"`)
    return { svg, widthPt, heightPt, widthCm, heightCm }
  } finally {
    chart.dispose()
  }
}

/** Characters outside the PDF standard fonts' Latin set, spelled out so they print. */
const PDF_TEXT: Record<string, string> = { Δ: 'Delta ', Γ: 'Gamma ', Ω: 'Omega ', '√': 'sqrt ', ν: 'nu', '−': '-', '·': '.', '–': '-', 'ħ': 'hbar', '₀': '0', '₂': '2', '₍': '(', '₎': ')' }

/** The figure as a vector PDF page of the same size. */
export async function figurePdf(fig: Figure): Promise<Blob> {
  const [{ jsPDF }] = await Promise.all([import('jspdf'), import('svg2pdf.js')])
  const text = fig.svg.replace(/[ΔΓΩ√ν−·–ħ₀₂₍₎]/g, (c) => PDF_TEXT[c] ?? c)
  const el = new DOMParser().parseFromString(text, 'image/svg+xml').documentElement as unknown as SVGSVGElement
  // svg2pdf measures text in the live document; the element is attached off screen while it converts.
  const host = document.createElement('div')
  host.style.cssText = 'position:fixed;left:-10000px;top:0;visibility:hidden'
  host.appendChild(el)
  document.body.appendChild(host)
  try {
    const doc = new jsPDF({ unit: 'pt', format: [fig.widthPt, fig.heightPt], orientation: fig.widthPt >= fig.heightPt ? 'landscape' : 'portrait' })
    await doc.svg(el, { x: 0, y: 0, width: fig.widthPt, height: fig.heightPt })
    return doc.output('blob')
  } finally {
    host.remove()
  }
}

/** Hands a file to the browser's download. */
export function saveFile(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob)
  const a = document.createElement('a')
  a.href = url
  a.download = fileName
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 10_000)
}

/** A file name from a chart title: letters, digits and dashes. */
export const figureFileName = (title: string, width: FigureWidth, format: FigureFormat) =>
  `${title.replace(/[^A-Za-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60) || 'figure'}-${FIGURE_WIDTH_CM[width]}cm.${format}`

export async function exportFigure(option: FigureOption, title: string, width: FigureWidth, format: FigureFormat, aspect?: number): Promise<void> {
  const fig = renderFigure(option, width, aspect)
  const blob = format === 'svg' ? new Blob([fig.svg], { type: 'image/svg+xml' }) : await figurePdf(fig)
  saveFile(blob, figureFileName(title, width, format))
}
