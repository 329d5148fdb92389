import { onBeforeUnmount, onMounted } from 'vue'

/**
 * Calls `tick` every `periodMs` while the tab is visible, and once at once when it becomes visible again,
 * so a background tab does not keep polling the server.
 */
export function useVisibleInterval(tick: () => void, periodMs: number): void {
  let timer: ReturnType<typeof setInterval> | undefined
  const visible = () => typeof document === 'undefined' || document.visibilityState !== 'hidden'
  const onVisibility = () => {
    if (visible()) tick()
  }
  onMounted(() => {
    timer = setInterval(() => visible() && tick(), periodMs)
    document.addEventListener('visibilitychange', onVisibility)
  })
  onBeforeUnmount(() => {
    clearInterval(timer)
    document.removeEventListener('visibilitychange', onVisibility)
  })
}
