// Run as its own process (`node --import tsx parse-memory-probe.ts FILE`): parses FILE with the shared
// parser and prints, as JSON, the resident memory before the parse and the process's peak after it, so
// the peak belongs to the parse and to nothing else a test runner holds.
import { readFileSync } from 'node:fs'
import { buildTrace, parseTraceFile } from '@shared/analysis/trace-parse'
import { TraceImportSettings } from '@shared/api/traces'

const bytes = new Uint8Array(readFileSync(process.argv[2]))
;(globalThis as { gc?: () => void }).gc?.()
const rssBefore = process.memoryUsage().rss
const peakBefore = process.resourceUsage().maxRSS * 1024
let outcome: string
try {
  const built = buildTrace(parseTraceFile(bytes), TraceImportSettings.parse({ name: 'probe', timeColumn: 0, timeUnit: 's', signalColumns: [1] }))
  outcome = `parsed ${built.timeNs.length} samples`
} catch (err) {
  outcome = (err as Error).message
}
const peakAfter = Math.max(process.resourceUsage().maxRSS * 1024, process.memoryUsage().rss)
console.log(JSON.stringify({ fileBytes: bytes.length, rssBefore, peakBefore, peakAfter, outcome }))
