// Parses the chosen file for the upload dialog's preview off the page's main thread, with the same
// parser the server runs, so a file of many megabytes does not freeze the page while it is read.
import '@/zod-jitless'
import { parseTraceFile, TraceParseError, type ParseOptions, type ParsedTable } from '@shared/analysis/trace-parse'

export interface PreviewRequest {
  seq: number
  bytes: Uint8Array
  options: ParseOptions
}

export type PreviewReply = { seq: number; table: ParsedTable; error?: undefined } | { seq: number; table?: undefined; error: string }

const post = (reply: PreviewReply, transfer: Transferable[] = []) => (self as unknown as Worker).postMessage(reply, transfer)

self.onmessage = (e: MessageEvent<PreviewRequest>) => {
  const { seq, bytes, options } = e.data
  try {
    const table = parseTraceFile(bytes, options)
    post({ seq, table }, [...table.data.map((d) => d.buffer as ArrayBuffer), table.rowLines.buffer as ArrayBuffer])
  } catch (err) {
    post({ seq, error: err instanceof TraceParseError ? err.message : String(err) })
  }
}
