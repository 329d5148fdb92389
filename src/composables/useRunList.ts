import { reactive, ref, watch } from 'vue'
import type { RunState } from '@shared/api/runs'
import { RUN_SORTS } from '@shared/api/runs'
import { listRuns } from '@/api/runs'
import { useAsync } from './useAsync'
import { useSessionStore } from '@/stores/session'

export interface RunListFilters {
  status: RunState | null
  author: 'me' | 'all'
  q: string
  /** folded: single runs and one row per sweep (default); single runs only; sweep points only. */
  kind: 'folded' | 'single' | 'sweep'
}
export type TableSort = Array<{ key: string; order?: 'asc' | 'desc' | boolean }>

/** The table's sort (one column) in the API's terms; columns the API cannot sort by fall back to newest first. */
export function apiSort(sortBy: TableSort): (typeof RUN_SORTS)[number] {
  const s = sortBy[0]
  if (!s) return 'created_desc'
  const desc = s.order === 'desc'
  if (s.key === 'createdAt') return desc ? 'created_desc' : 'created_asc'
  if (s.key === 'title') return desc ? 'title_desc' : 'title_asc'
  if (s.key === 'status') return 'status'
  return 'created_desc'
}

/** Waits this long after typing stops before searching (ms). */
const SEARCH_DEBOUNCE_MS = 300

/** The group's runs a page at a time, with filters; each row carries its waveguide name and key figure. */
export function useRunList(initialPageSize = 20) {
  const session = useSessionStore()
  const filters = reactive<RunListFilters>({ status: null, author: 'all', q: '', kind: 'folded' })
  const page = ref(1)
  const pageSize = ref(initialPageSize)
  const sortBy = ref<TableSort>([{ key: 'createdAt', order: 'desc' }])

  const list = useAsync(() =>
    listRuns({
      groupId: session.currentGroupId ?? undefined,
      status: filters.status ?? undefined,
      author: filters.author === 'me' ? 'me' : undefined,
      q: filters.q.trim() || undefined,
      // A status asks about runs, so a sweep's points are then listed one by one (its first need not match).
      kind: filters.kind === 'folded' && filters.status ? 'all' : filters.kind,
      sort: apiSort(sortBy.value),
      page: page.value,
      pageSize: pageSize.value,
    }),
  )

  async function load() {
    await list.run()
  }

  let timer: ReturnType<typeof setTimeout> | null = null
  watch(
    () => filters.q,
    () => {
      if (timer) clearTimeout(timer)
      timer = setTimeout(() => {
        page.value = 1
        void load()
      }, SEARCH_DEBOUNCE_MS)
    },
  )
  watch(
    () => [filters.status, filters.author, filters.kind, session.currentGroupId],
    () => {
      page.value = 1
      void load()
    },
  )

  /** v-data-table-server's update:options. */
  function onOptions(o: { page: number; itemsPerPage: number; sortBy: TableSort }) {
    page.value = o.page
    pageSize.value = o.itemsPerPage
    sortBy.value = o.sortBy
    void load()
  }

  return { filters, page, pageSize, sortBy, list, load, onOptions }
}
