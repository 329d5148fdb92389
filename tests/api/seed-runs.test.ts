// The demo runs queued on first start: every example once, in the group, by the editor; never twice.
import { readdirSync } from 'node:fs'
import { afterAll, describe, expect, it } from 'vitest'
import { EXAMPLES_DIR, queueExampleRuns } from '../../server/db/seed-runs'
import { silentLog, useTestDb } from './helpers'
import { newMember, queueSchemaFor, runRoutesForTest } from './runs-fixtures'

const { pool, db } = useTestDb()
const setup = runRoutesForTest(db, pool, queueSchemaFor('seed-runs'))
afterAll(async () => (await setup).jobs.stop())

describe('demo runs', () => {
  it('queues each example as a run of the group by the given author, once', async () => {
    const { jobs } = await setup
    const editor = await newMember(db, 'editor')
    const author = { userId: editor.userId, email: 'tomas@halden.example', isAdmin: false }
    const deps = { db, pool, boss: jobs.boss, log: silentLog }

    const n = await queueExampleRuns(deps, editor.groupId, author)

    const examples = readdirSync(EXAMPLES_DIR).filter((f) => f.endsWith('.json'))
    expect(n).toBe(examples.length)
    const { rows } = await pool.query(`select title, status, author_id, job_id from runs where group_id = $1 order by title`, [editor.groupId])
    expect(rows).toHaveLength(examples.length)
    for (const r of rows) {
      expect(r.status).toBe('queued')
      expect(r.author_id).toBe(editor.userId)
      expect(r.job_id).not.toBeNull()
    }
    expect(rows.map((r) => r.title)).toContain('Store and retrieve, R7 rib')

    expect(await queueExampleRuns(deps, editor.groupId, author)).toBe(0)
    const again = await pool.query(`select count(*)::int as n from runs where group_id = $1`, [editor.groupId])
    expect(again.rows[0].n).toBe(examples.length)
  })
})
