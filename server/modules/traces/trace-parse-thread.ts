// Parses uploaded trace files in a worker thread, one at a time, so reading a large file never holds up
// the API's event loop. Started by trace-parse-pool.ts through a bootstrap that registers tsx.
import { createHash } from 'node:crypto'
import { parentPort, threadId } from 'node:worker_threads'
import { buildTrace, parseTraceFile, TraceParseError, type ParseLocation } from '@shared/analysis/trace-parse'
import type { TraceColumn, TraceImportSettings, TraceSignalInfo, TraceTimeUnit } from '@shared/api/traces'

export interface ParseRequest {
  seq: number
  bytes: Uint8Array
  settings: TraceImportSettings
}

export type ParseReply =
  | {
      seq: number
      ok: true
      format: 'delimited' | 'npy'
      columns: TraceColumn[]
      timeUnit: TraceTimeUnit | null
      timeNs: Float64Array
      signals: Array<TraceSignalInfo & { values: Float64Array }>
      sha256: string
      threadId: number
    }
  | { seq: number; ok: false; parseError: boolean; message: string; field?: 'timeUnit'; where?: ParseLocation }

const port = parentPort
if (!port) throw new Error('trace-parse-thread.ts runs as a worker thread')

port.on('message', ({ seq, bytes, settings }: ParseRequest) => {
  try {
    const table = parseTraceFile(bytes, { delimiter: settings.delimiter, decimalSeparator: settings.decimalSeparator })
    const built = buildTrace(table, settings)
    const reply: ParseReply = {
      seq,
      ok: true,
      format: table.format,
      columns: table.columns,
      timeUnit: built.timeUnit,
      timeNs: built.timeNs,
      signals: built.signals,
      sha256: createHash('sha256').update(bytes).digest('hex'),
      threadId,
    }
    port.postMessage(reply, [built.timeNs.buffer as ArrayBuffer, ...built.signals.map((s) => s.values.buffer as ArrayBuffer)])
  } catch (err) {
    const parseError = err instanceof TraceParseError
    port.postMessage({
      seq,
      ok: false,
      parseError,
      message: (err as Error).message,
      ...(parseError && err.field ? { field: err.field } : {}),
      ...(parseError ? { where: { ...err.where } } : {}),
    } satisfies ParseReply)
  }
})
// Tells the pool the thread has loaded (its first start includes loading the parser's TypeScript).
port.postMessage({ type: 'ready' })
