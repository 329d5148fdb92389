import { computed, onScopeDispose, ref, shallowRef, watch, type Ref } from 'vue'
import { FINAL_RUN_STATES, type RunDetail } from '@shared/api/runs'
import { fetchRun, fetchRunArray, type RunArray } from '@/api/runs'
import { useAsync } from './useAsync'
import { useRunEvents } from './useRunEvents'
import { mapFrameOf, type MapFrame } from '@/components/run/run-layout'
import type { MapKey } from '@/components/run/run-map-buffer'
import { extraWaveTraces, type WaveTraceRef } from '@/components/run/wave-traces'

const FINAL_MAP_ARRAYS: Record<MapKey, string> = {
  pumpPowerW: 'map_pump_power_w',
  stokesPowerW: 'map_stokes_power_w',
  acousticPhononsPerM: 'map_acoustic_phonons_per_m',
}
const PORTS = ['pump_in', 'stokes_in', 'pump_out', 'stokes_out'] as const
export type PortKey = (typeof PORTS)[number]
export interface WaveTrace extends WaveTraceRef {
  input: Float64Array | null
  output: Float64Array | null
}
export interface ChannelTraces {
  timeNs: Float64Array
  ports: Record<PortKey, Float64Array>
  /** Waves beyond the pump–Stokes pair (co-propagating probe, cascade orders, forward waves); channel 1 only. */
  waves?: WaveTrace[]
}

/** How often the queue position is asked again while the run waits (ms). */
const QUEUE_POLL_MS = 5_000

/**
 * One run as its page shows it: the detail record, live status/progress/maps while it is queued or running,
 * and, once it has succeeded, the final maps and the port traces of the chosen channel.
 */
export function useRun(id: Ref<string>, share?: string) {
  const detail = useAsync((runId: string) => fetchRun(runId, share))
  const run = computed<RunDetail | null>(() => detail.data.value)
  const frame = computed<MapFrame | null>(() => (run.value ? mapFrameOf(run.value.config) : null))

  const liveId = ref<string | null>(null)
  const events = useRunEvents(liveId, { expectedSize: () => frame.value ?? { rows: 0, cols: 0 }, share })

  const status = computed(() => events.status.value ?? run.value?.status ?? null)
  const progress = computed(() => (events.status.value ? events.progress.value : (run.value?.progress ?? 0)))
  const isFinal = computed(() => status.value !== null && FINAL_RUN_STATES.includes(status.value))

  const finalMaps = shallowRef<Record<MapKey, RunArray> | null>(null)
  const channel = ref(0)
  const traces = shallowRef<ChannelTraces | null>(null)
  const results = useAsync(async (runId: string, ch: number) => {
    const [time, ...ports] = await Promise.all([fetchRunArray(runId, 'time_ns', share), ...PORTS.map((p) => fetchRunArray(runId, `ch${ch + 1}_${p}`, share))])
    const refs = ch === 0 && run.value ? extraWaveTraces(run.value.arrays, run.value.figures?.waves) : []
    const fetchOr = (name: string | null) => (name ? fetchRunArray(runId, name, share).then((a) => a.data as Float64Array) : Promise.resolve(null))
    const waves = await Promise.all(refs.map(async (w) => ({ ...w, input: await fetchOr(w.inName), output: await fetchOr(w.outName) })))
    const t: ChannelTraces = { timeNs: time.data as Float64Array, ports: Object.fromEntries(PORTS.map((p, i) => [p, ports[i].data])) as Record<PortKey, Float64Array>, waves }
    if (!finalMaps.value) {
      const maps = await Promise.all(Object.values(FINAL_MAP_ARRAYS).map((n) => fetchRunArray(runId, n, share)))
      finalMaps.value = Object.fromEntries(Object.keys(FINAL_MAP_ARRAYS).map((k, i) => [k, maps[i]])) as Record<MapKey, RunArray>
    }
    traces.value = t
    return t
  })

  async function load() {
    finalMaps.value = null
    traces.value = null
    // Another run under the same page (a clone opened from here): never show the old one meanwhile.
    if (detail.data.value && detail.data.value.id !== id.value) {
      detail.reset()
      liveId.value = null
    }
    const r = await detail.run(id.value)
    if (!r) return
    liveId.value = FINAL_RUN_STATES.includes(r.status) ? null : r.id
    if (r.status === 'succeeded') await results.run(r.id, channel.value)
  }

  // A live run that reaches its end: read the record again (figures, warnings, arrays), then the results.
  watch(events.status, async (s, before) => {
    if (!s || s === before || !FINAL_RUN_STATES.includes(s)) return
    const r = await detail.run(id.value)
    if (r?.status === 'succeeded') await results.run(r.id, channel.value)
  })
  watch(channel, (ch) => run.value?.status === 'succeeded' && void results.run(run.value.id, ch))
  watch(id, () => void load(), { immediate: true })

  // The API places a queued run in the queue; ask again now and then while it waits.
  const queuePosition = computed(() => (status.value === 'queued' ? (run.value?.queuePosition ?? null) : null))
  let timer: ReturnType<typeof setInterval> | null = null
  watch(status, (s) => {
    if (timer) clearInterval(timer)
    timer = s === 'queued' ? setInterval(() => void detail.run(id.value), QUEUE_POLL_MS) : null
  }, { immediate: true })
  onScopeDispose(() => timer && clearInterval(timer))

  /** Replace the record after an action (cancel answers with the new detail). */
  function replace(r: RunDetail) {
    detail.data.value = r
  }

  return { detail, run, frame, events, status, progress, isFinal, finalMaps, channel, traces, results, queuePosition, reload: load, replace }
}
