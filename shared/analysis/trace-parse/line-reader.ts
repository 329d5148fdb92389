// Bytes → text lines, one at a time. The file is decoded in chunks and only the line in hand (plus one
// chunk) is held as text, so reading a file costs memory for its longest line, not for all its lines.
// A line longer than the limit stops the read at once: a file without line breaks is not a table.
import { TRACE_MAX_LINE_CHARS } from '../../api/traces'
import { TraceParseError } from './errors'

/** Bytes decoded per step. */
const CHUNK_BYTES = 64 * 1024
const LINE_END = /\r\n|\r|\n/g

/** Thrown when the bytes are not UTF-8; the caller reads the file again as windows-1252. */
export class NotUtf8Error extends Error {}

export type TextEncoding = 'utf-8' | 'windows-1252'

export const lineTooLong = (lineNo: number, maxChars: number) =>
  new TraceParseError(
    `Line ${lineNo} is longer than ${maxChars.toLocaleString('en-US')} characters, the line-length limit for trace files. A table needs one sample per line: check that the file has its line breaks.`,
    { line: lineNo },
  )

export class LineReader {
  /** 1-based number of the line last returned by next(). */
  lineNo = 0
  private readonly decoder: InstanceType<typeof TextDecoder>
  private buf = ''
  private pos = 0
  private offset = 0

  constructor(
    private readonly bytes: Uint8Array,
    private readonly encoding: TextEncoding,
    private readonly maxChars = TRACE_MAX_LINE_CHARS,
  ) {
    // The UTF-8 decoder drops a leading byte-order mark by itself.
    this.decoder = new TextDecoder(encoding, { fatal: encoding === 'utf-8' })
  }

  private get exhausted(): boolean {
    return this.offset >= this.bytes.length
  }

  /** Appends the next chunk of decoded text; false at the end of the file. */
  private fill(): boolean {
    if (this.exhausted) return false
    const end = Math.min(this.bytes.length, this.offset + CHUNK_BYTES)
    let text: string
    try {
      text = this.decoder.decode(this.bytes.subarray(this.offset, end), { stream: end < this.bytes.length })
    } catch {
      throw new NotUtf8Error()
    }
    this.offset = end
    this.buf = this.buf.slice(this.pos) + text
    this.pos = 0
    return true
  }

  /** The next line without its line break, or null after the last one. */
  next(): string | null {
    for (;;) {
      LINE_END.lastIndex = this.pos
      const m = LINE_END.exec(this.buf)
      // A CR at the very end of the text read so far may be the first half of a CRLF.
      const mayBeSplitCrlf = m !== null && m[0] === '\r' && m.index === this.buf.length - 1 && !this.exhausted
      if (m && !mayBeSplitCrlf) {
        const line = this.buf.slice(this.pos, m.index)
        this.lineNo++
        if (line.length > this.maxChars) throw lineTooLong(this.lineNo, this.maxChars)
        this.pos = m.index + m[0].length
        return line
      }
      if (this.buf.length - this.pos > this.maxChars) throw lineTooLong(this.lineNo + 1, this.maxChars)
      if (!this.fill()) {
        if (this.pos >= this.buf.length) return null
        // The last line has no line break.
        const line = this.buf.slice(this.pos)
        this.pos = this.buf.length
        this.lineNo++
        return line
      }
    }
  }
}
