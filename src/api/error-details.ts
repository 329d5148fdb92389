// The details of an API error (shared/api/api-error.ts ERROR_DETAILS) as sentences a user can read. The message is
// always shown first; these lines add what it leaves out, never a JSON path or a raw value dump.
import { ERROR_DETAILS } from '@shared/api/api-error'
import type { ApiError } from './api-error'

const cells = (n: number) => n.toExponential(2)
const localTime = (iso: string) => new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })

/** "line 4, column 7" / "byte 1,024": where in an uploaded file a problem is. */
export function describeWhere(where: { line?: number; column?: number; byteOffset?: number }): string | null {
  if (where.line !== undefined) return `line ${where.line.toLocaleString()}${where.column !== undefined ? `, column ${where.column.toLocaleString()}` : ''}`
  if (where.byteOffset !== undefined) return `byte ${where.byteOffset.toLocaleString()}`
  return null
}

/** Extra lines to show under the error's message; empty when the details add nothing. */
export function errorDetailLines(err: Pick<ApiError, 'code' | 'message' | 'details'>): string[] {
  const said = err.message.toLowerCase()
  const schema = ERROR_DETAILS[err.code as keyof typeof ERROR_DETAILS]
  const parsed = schema?.safeParse(err.details)
  if (!parsed?.success) return []
  const d = parsed.data
  const lines: string[] = []
  if ('reasons' in d) {
    // The message joins the reasons into one paragraph; several read better one to a line.
    if (d.reasons.length > 1) lines.push(...d.reasons)
    if ('totalCellUpdates' in d) lines.push(`In total: ${cells(d.totalCellUpdates)} cell-updates over ${d.points} points; the limit for a sweep is ${cells(d.limitCellUpdates)}.`)
  }
  if ('where' in d) {
    const where = describeWhere(d.where)
    if (where && !said.includes(where)) lines.push(`The problem is at ${where} of the file.`)
  }
  if ('quota' in d) {
    const q = d.quota
    lines.push(`${q.scope === 'group' ? 'Group' : 'Your'} quota: ${q.used.toLocaleString()} of ${q.limit.toLocaleString()} used.`)
    if (q.freesAt) lines.push(`Room frees up at ${localTime(q.freesAt)} (your time).`)
  }
  return lines
}
