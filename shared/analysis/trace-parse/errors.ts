/** Where in the file a problem is: 1-based line and column of a text file, or a byte offset. */
export interface ParseLocation {
  line?: number
  column?: number
  byteOffset?: number
}

/**
 * A file that cannot become a trace. The message says what is wrong and where, ready to show; `field`
 * names the import setting the user must change when the fix is a choice rather than the file.
 */
export class TraceParseError extends Error {
  constructor(
    message: string,
    readonly where: ParseLocation = {},
    readonly field?: 'timeUnit',
  ) {
    super(message)
    this.name = 'TraceParseError'
  }
}
