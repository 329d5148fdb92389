import { and, asc, eq, sql } from 'drizzle-orm'
import type { Waveguide } from '@shared/physics/waveguide'
import type { Db } from '../../db/client'
import { users, waveguides } from '../../db/schema'

export interface WaveguideRecord {
  id: string
  groupId: string
  name: string
  params: Waveguide
  notes: string
  createdById: string | null
  createdByName: string | null
  createdAt: Date
  updatedAt: Date
}

const columns = {
  id: waveguides.id,
  groupId: waveguides.groupId,
  name: waveguides.name,
  params: waveguides.params,
  notes: waveguides.notes,
  createdById: waveguides.createdBy,
  createdByName: users.name,
  createdAt: waveguides.createdAt,
  updatedAt: waveguides.updatedAt,
}

/** The unique (group, lower(name)) index refused the write; drizzle wraps the pg error in `cause`. */
export function isDuplicateName(err: unknown): boolean {
  const e = err as { code?: string; constraint?: string; cause?: { code?: string; constraint?: string } }
  const pg = e?.code ? e : e?.cause
  return pg?.code === '23505' && pg.constraint === 'waveguides_group_name_lower_key'
}

export async function listWaveguides(db: Db, groupId: string): Promise<WaveguideRecord[]> {
  return db
    .select(columns)
    .from(waveguides)
    .leftJoin(users, eq(users.id, waveguides.createdBy))
    .where(eq(waveguides.groupId, groupId))
    .orderBy(asc(sql`lower(${waveguides.name})`))
}

export async function findWaveguide(db: Db, id: string): Promise<WaveguideRecord | null> {
  const [row] = await db.select(columns).from(waveguides).leftJoin(users, eq(users.id, waveguides.createdBy)).where(eq(waveguides.id, id))
  return row ?? null
}

/** Names in the group, for picking a free copy name. */
export async function groupWaveguideNames(db: Db, groupId: string): Promise<string[]> {
  const rows = await db.select({ name: waveguides.name }).from(waveguides).where(eq(waveguides.groupId, groupId))
  return rows.map((r) => r.name)
}

export async function insertWaveguide(db: Db, row: { groupId: string; params: Waveguide; notes: string; createdBy: string }): Promise<string> {
  const [created] = await db
    .insert(waveguides)
    .values({ ...row, name: row.params.name })
    .returning({ id: waveguides.id })
  return created.id
}

/** False when the row is gone (deleted meanwhile). */
export async function updateWaveguide(db: Db, id: string, params: Waveguide, notes: string | undefined): Promise<boolean> {
  const rows = await db
    .update(waveguides)
    .set({ name: params.name, params, ...(notes === undefined ? {} : { notes }), updatedAt: sql`now()` })
    .where(eq(waveguides.id, id))
    .returning({ id: waveguides.id })
  return rows.length > 0
}

export async function deleteWaveguide(db: Db, id: string, groupId: string): Promise<boolean> {
  const rows = await db
    .delete(waveguides)
    .where(and(eq(waveguides.id, id), eq(waveguides.groupId, groupId)))
    .returning({ id: waveguides.id })
  return rows.length > 0
}
