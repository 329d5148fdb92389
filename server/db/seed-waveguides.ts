// The demo group's own waveguide library: the waveguides its example runs use, so the library and the runs
// agree. Inserted once; a waveguide the group renamed or deleted is not brought back under its old name.
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { Waveguide } from '@shared/physics/waveguide'
import type { Db } from './client'
import { waveguides } from './schema'
import { EXAMPLES_DIR } from './seed-runs'

/** Distinct waveguides (by name) of the example configurations, parsed with the shared schema. */
export function exampleWaveguides(dir = EXAMPLES_DIR): Waveguide[] {
  const byName = new Map<string, Waveguide>()
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.json')).sort()) {
    const parsed = Waveguide.safeParse(JSON.parse(readFileSync(join(dir, file), 'utf8')).waveguide)
    if (parsed.success && !byName.has(parsed.data.name.toLowerCase())) byName.set(parsed.data.name.toLowerCase(), parsed.data)
  }
  return [...byName.values()]
}

export async function seedDemoWaveguides(db: Pick<Db, 'insert'>, groupId: string, createdBy: string, dir = EXAMPLES_DIR): Promise<number> {
  let created = 0
  for (const w of exampleWaveguides(dir)) {
    const rows = await db
      .insert(waveguides)
      .values({ groupId, name: w.name, params: w, notes: 'Demo waveguide of the Halden lab (invented values for the demo).', createdBy })
      .onConflictDoNothing()
      .returning({ id: waveguides.id })
    created += rows.length
  }
  return created
}
