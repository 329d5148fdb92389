import { computed } from 'vue'
import type { SpeedCalibration } from '@shared/physics/speed-calibration'
import { fetchSpeedCalibration } from '@/api/runs'
import { useAsync } from '@/composables/useAsync'

/**
 * This server's measured solver speeds, loaded when the form opens, so the form's estimate predicts the time
 * the server's workers take. Null until loaded, and when the load fails (signed out included: the form's own
 * sign-in prompt handles that): the estimate then uses the benchmark figures and says so.
 */
export function useSpeedCalibration() {
  const load = useAsync((signal: AbortSignal) => fetchSpeedCalibration(signal), { immediate: [new AbortController().signal], on401: 'keep' })
  return computed<SpeedCalibration | null>(() => load.data.value)
}
