// The upload dialog's parse of the chosen file: in a worker (trace-preview.worker.ts) so the page stays
// usable while a large file is read, again whenever the delimiter or decimal mark changes. Only the
// answer to the latest request is kept. Where workers are not available the parse runs in place.
import { onScopeDispose, shallowRef, watch, type Ref } from 'vue'
import { parseTraceFile, TraceParseError, type ParseOptions, type ParsedTable } from '@shared/analysis/trace-parse'
import type { PreviewReply, PreviewRequest } from '@/components/traces/trace-preview.worker'

export interface TracePreview {
  table: ParsedTable | null
  error: string | null
  reading: boolean
}

export function useTracePreview(bytes: Ref<Uint8Array | null>, options: () => ParseOptions): Ref<TracePreview> {
  const state = shallowRef<TracePreview>({ table: null, error: null, reading: false })
  let worker: Worker | null = null
  let seq = 0

  const inPlace = (b: Uint8Array, o: ParseOptions) => {
    try {
      state.value = { table: parseTraceFile(b, o), error: null, reading: false }
    } catch (e) {
      state.value = { table: null, error: e instanceof TraceParseError ? e.message : String(e), reading: false }
    }
  }

  const read = () => {
    const b = bytes.value
    const mine = ++seq
    if (!b) return void (state.value = { table: null, error: null, reading: false })
    if (typeof Worker === 'undefined') return inPlace(b, options())
    if (!worker) {
      worker = new Worker(new URL('../components/traces/trace-preview.worker.ts', import.meta.url), { type: 'module' })
      worker.onmessage = (e: MessageEvent<PreviewReply>) => {
        if (e.data.seq !== seq) return
        state.value = e.data.table ? { table: e.data.table, error: null, reading: false } : { table: null, error: e.data.error ?? 'The file could not be read', reading: false }
      }
      worker.onerror = () => {
        // A worker that cannot start (an old browser, a blocked script) leaves the parse to the page.
        worker?.terminate()
        worker = null
        if (bytes.value) inPlace(bytes.value, options())
      }
    }
    state.value = { ...state.value, reading: true }
    // The bytes are copied, not transferred: the dialog keeps them for the upload and a re-parse.
    worker.postMessage({ seq: mine, bytes: b, options: options() } satisfies PreviewRequest)
  }
  // Two plain getters, not one watch of [ref, getter]: a shallow ref among several sources makes Vue run
  // the callback on every change of anything the getters read (here: any edit of the settings).
  watch(() => bytes.value, read, { immediate: true })
  watch(() => JSON.stringify(options()), read)
  onScopeDispose(() => worker?.terminate())
  return state
}
