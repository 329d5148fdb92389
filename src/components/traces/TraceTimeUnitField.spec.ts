// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import { flushPromises } from '@vue/test-utils'
import { namedTimeUnit, parseTraceFile } from '@shared/analysis/trace-parse'
import type { TraceTimeUnit } from '@shared/api/traces'
import { mountWithApp } from '@/test-utils/mount'
import { getByRole } from '@/test-utils/by-role'
import TraceTimeUnitField from './TraceTimeUnitField.vue'
import { timeAxisOf } from './trace-time-unit'

afterEach(() => {
  document.body.innerHTML = ''
})

/** The field as the upload dialog uses it, on a parsed file, with its v-model exposed. */
function harness(text: string) {
  const table = parseTraceFile(new TextEncoder().encode(text))
  const s = table.suggestions
  const unit = ref<TraceTimeUnit | undefined>(s.timeUnit ?? undefined)
  const Host = defineComponent({
    setup: () => () =>
      h(TraceTimeUnitField, {
        modelValue: unit.value,
        axis: timeAxisOf(table.data, s.timeColumn),
        named: namedTimeUnit(table, s.timeColumn!),
        'onUpdate:modelValue': (v: TraceTimeUnit | undefined) => (unit.value = v),
      }),
  })
  return { Host, unit }
}

// No header: 400 samples, 0 to 7.98 in steps of 0.02 (the numbers of a µs time base).
const headerless = Array.from({ length: 400 }, (_, i) => `${(i * 0.02).toFixed(2)},${i % 5}`).join('\n')

describe('TraceTimeUnitField', () => {
  it('preselects nothing for a file that names no time unit and asks for one', async () => {
    const { Host, unit } = harness(headerless)
    const { wrapper } = await mountWithApp(Host)

    expect(unit.value).toBeUndefined()
    expect(getByRole(wrapper.element, 'alert').textContent).toMatch(/The file does not name the unit of its time column: choose it/)
  })

  it('shows the span and the sample spacing of the unit the user picks', async () => {
    const { Host, unit } = harness(headerless)
    const { wrapper } = await mountWithApp(Host)

    getByRole(wrapper.element, 'button', 'µs').click()
    await flushPromises()

    expect(unit.value).toBe('us')
    expect(wrapper.text()).toContain('Span 0–7.98 µs, one sample every 20 ns')

    getByRole(wrapper.element, 'button', 's').click()
    await flushPromises()
    expect(unit.value).toBe('s')
    expect(wrapper.text()).toContain('Span 0–7.98 s, one sample every 20 ms')
  })

  it('preselects the unit a header names and says where it came from', async () => {
    const { Host, unit } = harness(`Time (ns),P (W)\n${headerless}`)
    const { wrapper } = await mountWithApp(Host)

    expect(unit.value).toBe('ns')
    expect(wrapper.text()).toContain('Span 0–7.98 ns, one sample every 20 ps (read from the header)')
  })
})
