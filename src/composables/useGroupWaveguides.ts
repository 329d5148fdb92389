import { ref, watch, type Ref } from 'vue'
import type { SavedWaveguide } from '@shared/api/waveguides-api'
import { listGroupWaveguides } from '@/api/waveguides'
import { useAsync } from '@/composables/useAsync'

const byName = (a: SavedWaveguide, b: SavedWaveguide) => a.name.localeCompare(b.name, undefined, { sensitivity: 'base' })

/**
 * The current group's saved waveguides, reloaded when the group changes. Writes go through the api module;
 * callers hand the answer to upsert()/drop() so the list follows without a second request.
 */
export function useGroupWaveguides(groupId: Ref<string | null>) {
  const items = ref<SavedWaveguide[]>([])
  // Through useAsync: a lapsed session goes to sign-in; only the latest load's outcome is kept.
  const load = useAsync((id: string, signal: AbortSignal) => listGroupWaveguides(id, signal))
  let controller: AbortController | null = null

  async function reload() {
    controller?.abort()
    items.value = []
    const id = groupId.value
    if (!id) return load.reset()
    const mine = (controller = new AbortController())
    const list = await load.run(id, mine.signal)
    if (list && controller === mine) items.value = [...list].sort(byName)
  }

  function upsert(w: SavedWaveguide) {
    items.value = [...items.value.filter((x) => x.id !== w.id), w].sort(byName)
  }
  function drop(id: string) {
    items.value = items.value.filter((x) => x.id !== id)
  }

  watch(groupId, reload, { immediate: true })
  return { items, loading: load.loading, error: load.error, reload, upsert, drop }
}
