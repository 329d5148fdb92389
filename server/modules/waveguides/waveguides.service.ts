// Use cases of a group's saved waveguides. Viewers read; editors create, change, copy and delete.
import { copyName, type SavedWaveguide, type SavedWaveguideCreate, type SavedWaveguideDuplicate, type SavedWaveguideUpdate } from '@shared/api/waveguides-api'
import type { Db } from '../../db/client'
import { conflict, notFound, unauthorized } from '../../errors'
import { requireGroupRole, type Role } from '../../policy/access'
import { isUuid } from '../../policy/ids'
import type { AuthContext } from '../auth/auth-context'
import {
  deleteWaveguide,
  findWaveguide,
  groupWaveguideNames,
  insertWaveguide,
  isDuplicateName,
  listWaveguides,
  updateWaveguide,
  type WaveguideRecord,
} from './waveguides.repo'

export interface WaveguidesDeps {
  db: Db
}

const WHAT = 'Waveguide'

function toApi(r: WaveguideRecord): SavedWaveguide {
  return {
    id: r.id,
    groupId: r.groupId,
    name: r.name,
    // The column is the name of record; params.name is written with it.
    waveguide: { ...r.params, name: r.name },
    notes: r.notes,
    createdById: r.createdById,
    createdByName: r.createdByName,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  }
}

const nameTaken = (name: string) =>
  conflict(`The group already has a waveguide named "${name}" (names are compared ignoring case); choose another name`)

/** Runs a write; the unique name index turns into a 409 naming the clash. */
async function guardName<T>(name: string, write: () => Promise<T>): Promise<T> {
  try {
    return await write()
  } catch (err) {
    if (isDuplicateName(err)) throw nameTaken(name)
    throw err
  }
}

/** The waveguide when the caller has at least minRole in its group (derived from the row); 404 otherwise. */
async function waveguideFor(deps: WaveguidesDeps, auth: AuthContext | undefined, id: string, minRole: Role): Promise<WaveguideRecord> {
  const row = isUuid(id) ? await findWaveguide(deps.db, id) : null
  if (!auth) throw unauthorized()
  if (!row) throw notFound(WHAT)
  await requireGroupRole(deps.db, auth, row.groupId, minRole, WHAT)
  return row
}

export async function listGroupWaveguides(deps: WaveguidesDeps, auth: AuthContext | undefined, groupId: string): Promise<SavedWaveguide[]> {
  await requireGroupRole(deps.db, auth, groupId, 'viewer', 'Group')
  return (await listWaveguides(deps.db, groupId)).map(toApi)
}

export async function getWaveguide(deps: WaveguidesDeps, auth: AuthContext | undefined, id: string): Promise<SavedWaveguide> {
  return toApi(await waveguideFor(deps, auth, id, 'viewer'))
}

export async function createWaveguide(deps: WaveguidesDeps, auth: AuthContext | undefined, input: SavedWaveguideCreate): Promise<SavedWaveguide> {
  await requireGroupRole(deps.db, auth, input.groupId, 'editor', 'Group')
  const id = await guardName(input.waveguide.name, () =>
    insertWaveguide(deps.db, { groupId: input.groupId, params: input.waveguide, notes: input.notes, createdBy: auth!.userId }),
  )
  return toApi((await findWaveguide(deps.db, id))!)
}

export async function replaceWaveguide(deps: WaveguidesDeps, auth: AuthContext | undefined, id: string, input: SavedWaveguideUpdate): Promise<SavedWaveguide> {
  const row = await waveguideFor(deps, auth, id, 'editor')
  const updated = await guardName(input.waveguide.name, () => updateWaveguide(deps.db, row.id, input.waveguide, input.notes))
  if (!updated) throw notFound(WHAT)
  return toApi((await findWaveguide(deps.db, row.id))!)
}

export async function removeWaveguide(deps: WaveguidesDeps, auth: AuthContext | undefined, id: string): Promise<void> {
  const row = await waveguideFor(deps, auth, id, 'editor')
  if (!(await deleteWaveguide(deps.db, row.id, row.groupId))) throw notFound(WHAT)
}

// Two copies made at the same moment may pick the same free name; the loser picks again.
const COPY_ATTEMPTS = 3

export async function duplicateWaveguide(deps: WaveguidesDeps, auth: AuthContext | undefined, id: string, input: SavedWaveguideDuplicate): Promise<SavedWaveguide> {
  const source = await waveguideFor(deps, auth, id, 'editor')
  const create = (name: string) =>
    insertWaveguide(deps.db, { groupId: source.groupId, params: { ...source.params, name }, notes: source.notes, createdBy: auth!.userId })
  if (input.name) return toApi((await findWaveguide(deps.db, await guardName(input.name, () => create(input.name!))))!)
  for (let attempt = 1; ; attempt++) {
    const name = copyName(source.name, await groupWaveguideNames(deps.db, source.groupId))
    try {
      return toApi((await findWaveguide(deps.db, await create(name)))!)
    } catch (err) {
      if (!isDuplicateName(err)) throw err
      if (attempt >= COPY_ATTEMPTS) throw nameTaken(name)
    }
  }
}
