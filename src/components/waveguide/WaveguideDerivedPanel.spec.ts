// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { mountWithApp } from '@/test-utils/mount'
import { getByRole } from '@/test-utils/by-role'
import WaveguidesPage from '@/pages/WaveguidesPage.vue'

afterEach(() => {
  document.body.innerHTML = ''
})

async function typeInto(input: HTMLElement, text: string) {
  const el = input as HTMLInputElement
  el.value = text
  el.dispatchEvent(new Event('input'))
  await flushPromises()
}

/** The number shown in the derived table for one quantity, parsed back (handles "a × 10ⁿ"). */
function shown(root: Element, quantity: string): number {
  const cell = root.querySelector(`tr[data-quantity="${quantity}"] td`)
  if (!cell) throw new Error(`no row ${quantity}`)
  const sup: Record<string, string> = { '⁻': '-', '⁰': '0', '¹': '1', '²': '2', '³': '3', '⁴': '4', '⁵': '5', '⁶': '6', '⁷': '7', '⁸': '8', '⁹': '9' }
  const text = cell.textContent!.trim().replace(/ × 10([⁻⁰-⁹¹²³]+)/, (_, e: string) => `e${[...e].map((c) => sup[c]).join('')}`)
  return Number(text)
}

describe('WaveguideDerivedPanel on the waveguide page', () => {
  it('recomputes the phonon lifetimes as the linewidth is typed, labelled energy and amplitude', async () => {
    const { wrapper } = await mountWithApp(WaveguidesPage, { path: '/waveguides' })
    const table = getByRole(wrapper.element, 'table', 'Derived quantities')

    await typeInto(getByRole(wrapper.element, 'textbox', 'Linewidth Δν_B (FWHM)'), '50')

    // Energy lifetime 1/Γ_B and amplitude lifetime 2/Γ_B with Γ_B = 2π Δν_B (docs/model.md, conventions; Agrawal ch. 9):
    // Δν_B = 50 MHz gives 1/(2π·50e6 s⁻¹) = 3.1831 ns.
    expect(shown(table, 'phononLifetimeEnergyNs')).toBeCloseTo(1 / (2 * Math.PI * 50e6) / 1e-9, 3)
    expect(shown(table, 'phononLifetimeAmplitudeNs')).toBeCloseTo(2 / (2 * Math.PI * 50e6) / 1e-9, 3)
    expect(table.textContent).toContain('Phonon lifetime (energy, phonon number)')
    expect(table.textContent).toContain('Phonon lifetime (amplitude)')
  })

  it('gives the Smith 1972 critical power of validation case V8 after the length is set to 20 km', async () => {
    const { wrapper } = await mountWithApp(WaveguidesPage, { path: '/waveguides' })
    const table = getByRole(wrapper.element, 'table', 'Derived quantities')
    const before = shown(table, 'criticalPowerW')

    // V8 (docs/validation.md, Smith 1972): A_eff = 80 µm², g_B = 5e-11 m/W, 20 km at 0.2 dB/km → L_eff = 13 069.9 m, P_cr = 2.571 mW.
    await typeInto(getByRole(wrapper.element, 'textbox', 'Length L'), '20000')

    expect(shown(table, 'effectiveLengthM')).toBeCloseTo(13070, -1)
    expect(shown(table, 'criticalPowerW')).toBeCloseTo(2.571e-3, 6)
    expect(before).not.toBeCloseTo(2.571e-3, 6)
    expect(table.textContent).toMatch(/Rule of thumb \(Smith 1972\)/)
  })

  it('shows the schema message under an invalid field and hides the derived values until it is fixed', async () => {
    const { wrapper } = await mountWithApp(WaveguidesPage, { path: '/waveguides' })
    const area = getByRole(wrapper.element, 'textbox', 'Effective area A_eff')

    await typeInto(area, '-3')

    expect(area.closest('.v-input')!.textContent).toMatch(/must be more than 0 µm²/)
    expect(wrapper.element.querySelector('table[aria-label="Derived quantities"]')).toBeNull()
    expect(wrapper.text()).toContain('Correct the marked waveguide fields')

    await typeInto(area, '80')
    expect(wrapper.element.querySelector('table[aria-label="Derived quantities"]')).not.toBeNull()
  })
})
