import { reactive, ref, shallowRef, watch } from 'vue'
import type { RunDetail, RunState, RunSummary } from '@shared/runs'
import { RUN_SORTS } from '@shared/runs'
import { fetchRun, listRuns } from '@/api/runs'
import { useAsync } from './useAsync'
import { useSessionStore } from '@/stores/session'

export interface RunListFilters {
  status: RunState | null
  author: 'me' | 'all'
  q: string
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
const DETAIL_CONCURRENCY = 4

/**
 * The group's runs a page at a time, with filters. The list answer carries no waveguide or figures, so the
 * rows on screen get their detail fetched in the background (cached by id) to fill those two columns.
 */
export function useRunList(initialPageSize = 20) {
  const session = useSessionStore()
  const filters = reactive<RunListFilters>({ status: null, author: 'all', q: '' })
  const page = ref(1)
  const pageSize = ref(initialPageSize)
  const sortBy = ref<TableSort>([{ key: 'createdAt', order: 'desc' }])

  const list = useAsync(() =>
    listRuns({
      groupId: session.currentGroupId ?? undefined,
      status: filters.status ?? undefined,
      author: filters.author === 'me' ? 'me' : undefined,
      q: filters.q.trim() || undefined,
      sort: apiSort(sortBy.value),
      page: page.value,
      pageSize: pageSize.value,
    }),
  )

  const details = shallowRef(new Map<string, RunDetail>())
  async function fillDetails(items: RunSummary[]) {
    const todo = items.filter((r) => !details.value.has(r.id) || details.value.get(r.id)!.status !== r.status)
    for (let i = 0; i < todo.length; i += DETAIL_CONCURRENCY) {
      const got = await Promise.allSettled(todo.slice(i, i + DETAIL_CONCURRENCY).map((r) => fetchRun(r.id)))
      const next = new Map(details.value)
      for (const g of got) if (g.status === 'fulfilled') next.set(g.value.id, g.value)
      details.value = next
    }
  }

  async function load() {
    const res = await list.run()
    if (res) void fillDetails(res.items)
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
    () => [filters.status, filters.author, session.currentGroupId],
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

  return { filters, page, pageSize, sortBy, list, details, load, onOptions }
}
