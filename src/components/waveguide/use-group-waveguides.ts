import { ref, watch, type Ref } from 'vue'
import type { SavedWaveguide } from '@shared/waveguides-api'
import { ApiError } from '@/api/client'
import { listGroupWaveguides } from '@/api/waveguides'

const byName = (a: SavedWaveguide, b: SavedWaveguide) => a.name.localeCompare(b.name, undefined, { sensitivity: 'base' })

/**
 * The current group's saved waveguides, reloaded when the group changes. Writes go through the api module;
 * callers hand the answer to upsert()/drop() so the list follows without a second request.
 */
export function useGroupWaveguides(groupId: Ref<string | null>) {
  const items = ref<SavedWaveguide[]>([])
  const loading = ref(false)
  const error = ref<ApiError | null>(null)
  let controller: AbortController | null = null

  async function reload() {
    controller?.abort()
    items.value = []
    error.value = null
    const id = groupId.value
    if (!id) return
    const mine = (controller = new AbortController())
    loading.value = true
    try {
      items.value = (await listGroupWaveguides(id, mine.signal)).sort(byName)
    } catch (e) {
      if (mine.signal.aborted) return
      error.value = e instanceof ApiError ? e : new ApiError(0, 'unknown', String(e))
    } finally {
      if (controller === mine) loading.value = false
    }
  }

  function upsert(w: SavedWaveguide) {
    items.value = [...items.value.filter((x) => x.id !== w.id), w].sort(byName)
  }
  function drop(id: string) {
    items.value = items.value.filter((x) => x.id !== id)
  }

  watch(groupId, reload, { immediate: true })
  return { items, loading, error, reload, upsert, drop }
}
