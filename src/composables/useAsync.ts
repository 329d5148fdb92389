import { ref, shallowRef, type Ref, type ShallowRef } from 'vue'
import { useRouter, type Router } from 'vue-router'
import { ApiError } from '@/api/client'
import { useSessionStore } from '@/stores/session'

export interface UseAsyncOptions<A extends unknown[]> {
  /** Run at once with these arguments (for loads on page open). */
  immediate?: A | boolean
  /** Default 'sign-in': a 401 clears the session and sends the user to sign in, then back here. */
  on401?: 'sign-in' | 'keep'
}

export interface UseAsync<T, A extends unknown[]> {
  data: ShallowRef<T | null>
  error: ShallowRef<ApiError | null>
  loading: Ref<boolean>
  /** Resolves to the data, or null when the call failed (the error is in `error`). Never rejects. */
  run: (...args: A) => Promise<T | null>
  reset: () => void
}

/** The one 401 policy: forget the session, go to sign-in, come back to where we were afterwards. */
export async function sendToSignIn(router: Router): Promise<void> {
  useSessionStore().clear()
  const here = router.currentRoute.value
  if (here.name === 'sign-in') return
  await router.push({ name: 'sign-in', query: { redirect: here.fullPath } })
}

const toApiError = (e: unknown): ApiError =>
  e instanceof ApiError ? e : new ApiError(0, 'client', e instanceof Error ? e.message : String(e))

/** loading / error / data refs around one async call. Only the latest call's outcome is kept. */
export function useAsync<T, A extends unknown[] = []>(
  fn: (...args: A) => Promise<T>,
  options: UseAsyncOptions<A> = {},
): UseAsync<T, A> {
  const router = useRouter()
  const data = shallowRef<T | null>(null)
  const error = shallowRef<ApiError | null>(null)
  const loading = ref(false)
  let latest = 0

  async function run(...args: A): Promise<T | null> {
    const call = ++latest
    loading.value = true
    error.value = null
    try {
      const result = await fn(...args)
      if (call === latest) data.value = result
      return result
    } catch (e) {
      const err = toApiError(e)
      if (call === latest) error.value = err
      if (err.isUnauthenticated && options.on401 !== 'keep') await sendToSignIn(router)
      return null
    } finally {
      if (call === latest) loading.value = false
    }
  }

  function reset() {
    latest++
    data.value = null
    error.value = null
    loading.value = false
  }

  const { immediate } = options
  if (immediate) void run(...((Array.isArray(immediate) ? immediate : []) as A))

  return { data, error, loading, run, reset }
}
