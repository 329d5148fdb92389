// Refuses bytes that are not text before anything is decoded. (Decoding is line by line, in
// line-reader.ts: UTF-8 first; files from older instruments in Latin-1, "µs" as byte 0xB5, fall back to
// windows-1252.)
import { TraceParseError } from './errors'

/** Control bytes other than tab, LF, CR and form feed: a text file has none (or nearly none). */
function isControl(b: number): boolean {
  return b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d && b !== 0x0c
}

/** Share of control bytes tolerated before a file counts as binary (a stray one survives). */
const MAX_CONTROL_SHARE = 0.001

export function assertText(bytes: Uint8Array): void {
  if (bytes.length === 0) throw new TraceParseError('The file is empty')
  let controls = 0
  let first = -1
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i]
    if (b === 0 || isControl(b)) {
      if (first < 0) first = i
      controls++
      if (b === 0 || controls > Math.max(1, bytes.length * MAX_CONTROL_SHARE)) {
        throw new TraceParseError(
          `This is not a text file or an NPY array: binary byte 0x${b.toString(16).padStart(2, '0')} at offset ${first}. Upload delimited text (CSV, TSV, …) or a .npy file.`,
          { byteOffset: first },
        )
      }
    }
  }
}
