// Reads and writes of stored traces; plain objects out. Byte columns are read only by the calls that need them.
import { and, count, desc, eq, getTableColumns, ilike, or } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { traces, users, type NewTraceRow, type TraceRow } from '../../db/schema'

const { original: _original, timeNs: _timeNs, signalData: _signalData, ...metaColumns } = getTableColumns(traces)
const withAuthor = { ...metaColumns, authorName: users.name }

export type TraceMeta = Omit<TraceRow, 'original' | 'timeNs' | 'signalData'> & { authorName: string | null }

export async function insertTrace(db: Db, row: NewTraceRow): Promise<string> {
  const [r] = await db.insert(traces).values(row).returning({ id: traces.id })
  return r.id
}

export async function findTraceMeta(db: Db, id: string): Promise<TraceMeta | null> {
  const [row] = await db.select(withAuthor).from(traces).leftJoin(users, eq(users.id, traces.authorId)).where(eq(traces.id, id))
  return row ?? null
}

export async function findTraceArrays(db: Db, id: string): Promise<{ timeNs: Buffer; signalData: Buffer } | null> {
  const [row] = await db.select({ timeNs: traces.timeNs, signalData: traces.signalData }).from(traces).where(eq(traces.id, id))
  return row ?? null
}

export async function findTraceOriginal(db: Db, id: string): Promise<{ original: Buffer; fileName: string; contentType: string } | null> {
  const [row] = await db.select({ original: traces.original, fileName: traces.fileName, contentType: traces.contentType }).from(traces).where(eq(traces.id, id))
  return row ?? null
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`)

export async function listTraces(db: Db, groupId: string, q: string | undefined, page: number, pageSize: number): Promise<{ rows: TraceMeta[]; total: number }> {
  const where = and(eq(traces.groupId, groupId), q ? or(ilike(traces.name, `%${escapeLike(q)}%`), ilike(traces.fileName, `%${escapeLike(q)}%`)) : undefined)
  const [rows, [{ n }]] = await Promise.all([
    db
      .select(withAuthor)
      .from(traces)
      .leftJoin(users, eq(users.id, traces.authorId))
      .where(where)
      .orderBy(desc(traces.createdAt), desc(traces.id))
      .limit(pageSize)
      .offset((page - 1) * pageSize),
    db.select({ n: count() }).from(traces).where(where),
  ])
  return { rows, total: Number(n) }
}

export async function deleteTrace(db: Db, id: string): Promise<void> {
  await db.delete(traces).where(eq(traces.id, id))
}
