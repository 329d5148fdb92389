// Reads of runs for the API; plain objects out. The worker's writes live in server/jobs/run-store.ts.
import { and, asc, count, desc, eq, getTableColumns, ilike, inArray, isNotNull, isNull, lt, or, sql, type SQL } from 'drizzle-orm'
import type { RunListQuery } from '@shared/api/runs'
import type { Db } from '../../db/client'
import { memberships, runArrays, runs, users, type Run } from '../../db/schema'

export type RunRow = Run & { authorName: string | null }

const withAuthor = { ...getTableColumns(runs), authorName: users.name }

export async function findRun(db: Db, id: string): Promise<RunRow | null> {
  const [row] = await db.select(withAuthor).from(runs).leftJoin(users, eq(users.id, runs.authorId)).where(eq(runs.id, id))
  return row ?? null
}

export async function findByIdempotencyKey(db: Db, authorId: string, key: string): Promise<RunRow | null> {
  const [row] = await db
    .select(withAuthor)
    .from(runs)
    .leftJoin(users, eq(users.id, runs.authorId))
    .where(and(eq(runs.authorId, authorId), eq(runs.idempotencyKey, key)))
  return row ?? null
}

const SORTS: Record<RunListQuery['sort'], SQL[]> = {
  created_desc: [desc(runs.createdAt), desc(runs.id)],
  created_asc: [asc(runs.createdAt), asc(runs.id)],
  title_asc: [asc(runs.title), desc(runs.createdAt)],
  title_desc: [desc(runs.title), desc(runs.createdAt)],
  status: [asc(runs.status), desc(runs.createdAt)],
}

/** A sweep's head row: its lowest point's newest run (a re-run point has several). */
const sweepHead = sql`${runs.id} = (select h.id from runs h where h.sweep_id = ${runs.sweepId} order by h.sweep_point, h.created_at desc, h.id desc limit 1)`

/** Runs of the groups `userId` belongs to (or of `q.groupId`, already checked by the caller). */
export async function listRuns(db: Db, userId: string, q: RunListQuery): Promise<{ rows: RunRow[]; total: number }> {
  const memberGroups = db.select({ id: memberships.groupId }).from(memberships).where(eq(memberships.userId, userId))
  const where = and(
    q.groupId ? eq(runs.groupId, q.groupId) : inArray(runs.groupId, memberGroups),
    q.status ? eq(runs.status, q.status) : undefined,
    q.author ? eq(runs.authorId, q.author === 'me' ? userId : q.author) : undefined,
    q.q ? or(ilike(runs.title, `%${escapeLike(q.q)}%`), ilike(runs.notes, `%${escapeLike(q.q)}%`)) : undefined,
    q.kind === 'single' ? isNull(runs.sweepId) : q.kind === 'sweep' ? isNotNull(runs.sweepId) : q.kind === 'folded' ? or(isNull(runs.sweepId), sweepHead) : undefined,
  )
  const [rows, [{ n }]] = await Promise.all([
    db
      .select(withAuthor)
      .from(runs)
      .leftJoin(users, eq(users.id, runs.authorId))
      .where(where)
      .orderBy(...SORTS[q.sort])
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    db.select({ n: count() }).from(runs).where(where),
  ])
  return { rows, total: Number(n) }
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`)

export interface StoredArray {
  name: string
  dtype: 'c16' | 'f8' | 'f4'
  shape: number[]
  units: string
  description: string
  data: Buffer
}

/** One result array of the run's current attempt. */
export async function findArray(db: Db, runId: string, attempt: number, name: string): Promise<StoredArray | null> {
  const [row] = await db
    .select({ name: runArrays.name, dtype: runArrays.dtype, shape: runArrays.shape, units: runArrays.units, description: runArrays.description, data: runArrays.data })
    .from(runArrays)
    .where(and(eq(runArrays.runId, runId), eq(runArrays.attempt, attempt), eq(runArrays.name, name)))
  return row ?? null
}

/**
 * 1-based place of a queued single run in the order workers take them (lowest rank first, then oldest:
 * server/jobs/fair-priority.ts), among every group's queued single runs; null otherwise. A later run of
 * someone with less in flight may still move in ahead of it.
 */
export async function queuePositionOf(db: Db, run: Pick<RunRow, 'id' | 'status' | 'sweepId' | 'createdAt' | 'queueRank'>): Promise<number | null> {
  if (run.status !== 'queued' || run.sweepId) return null
  const [row] = await db
    .select({ ahead: count() })
    .from(runs)
    .where(and(eq(runs.status, 'queued'), isNull(runs.sweepId), or(lt(runs.queueRank, run.queueRank), and(eq(runs.queueRank, run.queueRank), lt(runs.createdAt, run.createdAt)))))
  return row.ahead + 1
}
