// A group's saved waveguides as the API and the client see them: requests, responses and the copy name rule.
import { z } from 'zod'
import { safeText } from './text'
import { Waveguide } from '../physics/waveguide'

export const WAVEGUIDE_NOTES_MAX = 10_000
/** Longest name the shared Waveguide schema accepts; copy names are cut to fit it. */
export const WAVEGUIDE_NAME_MAX = 120

const Notes = safeText().max(WAVEGUIDE_NOTES_MAX).describe('Free text kept with the waveguide (where the numbers come from, sample id)')

export const SavedWaveguideListQuery = z.object({
  groupId: z.uuid({ error: 'must be the id of one of your groups' }),
})
export type SavedWaveguideListQuery = z.infer<typeof SavedWaveguideListQuery>

export const SavedWaveguideCreate = z.object({
  groupId: z.uuid({ error: 'must be the id of one of your groups' }),
  waveguide: Waveguide,
  notes: Notes.default(''),
})
export type SavedWaveguideCreate = z.infer<typeof SavedWaveguideCreate>
export type SavedWaveguideCreateInput = z.input<typeof SavedWaveguideCreate>

/** Replaces the parameters (name included); notes stay as they were when left out. */
export const SavedWaveguideUpdate = z.object({
  waveguide: Waveguide,
  notes: Notes.optional(),
})
export type SavedWaveguideUpdate = z.infer<typeof SavedWaveguideUpdate>
export type SavedWaveguideUpdateInput = z.input<typeof SavedWaveguideUpdate>

/** Optional name for the copy; without it the copy is called "<name> (copy)", numbered when taken. */
export const SavedWaveguideDuplicate = z.object({
  name: safeText().trim().min(1, 'must not be empty').max(WAVEGUIDE_NAME_MAX).optional(),
})
export type SavedWaveguideDuplicate = z.infer<typeof SavedWaveguideDuplicate>

export const SavedWaveguide = z.object({
  id: z.uuid(),
  groupId: z.uuid(),
  name: z.string(),
  waveguide: Waveguide,
  notes: z.string(),
  createdById: z.uuid().nullable(),
  createdByName: z.string().nullable(),
  createdAt: z.iso.datetime({ offset: true }),
  updatedAt: z.iso.datetime({ offset: true }),
})
export type SavedWaveguide = z.infer<typeof SavedWaveguide>

export const SavedWaveguideList = z.object({ waveguides: z.array(SavedWaveguide) })
export type SavedWaveguideList = z.infer<typeof SavedWaveguideList>

/**
 * The first free copy name: "<name> (copy)", then "<name> (copy 2)", "(copy 3)" …, compared ignoring
 * case as the database does. A trailing "(copy N)" on the source is dropped first, so copies of copies
 * do not pile up suffixes; the base is cut so the whole name stays within WAVEGUIDE_NAME_MAX.
 */
export function copyName(name: string, taken: Iterable<string>): string {
  const used = new Set([...taken].map((n) => n.toLowerCase()))
  const base = name.replace(/\s*\(copy(?: \d+)?\)$/i, '').trim() || name.trim()
  for (let n = 1; ; n++) {
    const suffix = n === 1 ? ' (copy)' : ` (copy ${n})`
    const candidate = base.slice(0, WAVEGUIDE_NAME_MAX - suffix.length).trimEnd() + suffix
    if (!used.has(candidate.toLowerCase())) return candidate
  }
}
