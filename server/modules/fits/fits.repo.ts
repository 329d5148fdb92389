// Fit rows; plain objects out.
import { and, desc, eq, getTableColumns } from 'drizzle-orm'
import type { FitRequest, FitResult } from '@shared/api/fits'
import type { Db } from '../../db/client'
import { fits, users, type FitRow } from '../../db/schema'

export type FitRecord = FitRow & { authorName: string | null }
const withAuthor = { ...getTableColumns(fits), authorName: users.name }

export async function insertFit(db: Db, row: { groupId: string; authorId: string; traceId: string; runId: string; inputs: FitRequest; status?: FitRow['status']; result?: FitResult; progress?: number; message?: string; finishedAt?: Date; startedAt?: Date }): Promise<string> {
  const [r] = await db.insert(fits).values(row).returning({ id: fits.id })
  return r.id
}

export async function findFit(db: Db, id: string): Promise<FitRecord | null> {
  const [row] = await db.select(withAuthor).from(fits).leftJoin(users, eq(users.id, fits.authorId)).where(eq(fits.id, id))
  return row ?? null
}

export async function listFits(db: Db, by: { traceId?: string; runId?: string }): Promise<FitRecord[]> {
  return db
    .select(withAuthor)
    .from(fits)
    .leftJoin(users, eq(users.id, fits.authorId))
    .where(and(by.traceId ? eq(fits.traceId, by.traceId) : undefined, by.runId ? eq(fits.runId, by.runId) : undefined))
    .orderBy(desc(fits.createdAt))
    .limit(50)
}
