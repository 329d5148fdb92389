import { describe, expect, it } from 'vitest'
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { seedDemo } from '../../server/db/seed'
import { EXAMPLES_DIR } from '../../server/db/seed-runs'
import { useTestDb } from './helpers'

const { db, pool } = useTestDb()

describe('the demo seed', () => {
  it('creates the group, one member per role and the waveguides its example runs use, and adds nothing the second time', async () => {
    const exampleNames = new Set(
      readdirSync(EXAMPLES_DIR)
        .filter((f) => f.endsWith('.json'))
        .map((f) => JSON.parse(readFileSync(join(EXAMPLES_DIR, f), 'utf8')).waveguide.name as string),
    )

    const first = await seedDemo(db)
    const second = await seedDemo(db)

    expect(first).toEqual({ created: 3, waveguides: exampleNames.size })
    expect(second).toEqual({ created: 0, waveguides: 0 })
    const { rows: roles } = await pool.query(`select m.role from memberships m join groups g on g.id = m.group_id where g.slug = 'halden-lab' order by m.role`)
    expect(roles.map((r) => r.role)).toEqual(['owner', 'editor', 'viewer'])
    const { rows: saved } = await pool.query(`select w.name, w.params->>'name' as params_name from waveguides w join groups g on g.id = w.group_id where g.slug = 'halden-lab'`)
    expect(new Set(saved.map((r) => r.name))).toEqual(exampleNames)
    expect(saved.every((r) => r.name === r.params_name)).toBe(true)
  })
})
