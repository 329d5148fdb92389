// A finished sweep sends its author one digest mail, not one per point, with absolute links; the
// per-user setting turns it off. Points are solved here with the real solver in-process and stored as a
// worker would store them, then the worker's own finish hook and the sweep closer run.
import { eq } from 'drizzle-orm'
import request from 'supertest'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { SweepDetail } from '@shared/api/sweeps'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { createApp } from '../../server/app'
import { users } from '../../server/db/schema'
import { formatDuration, mailRunOutcome, runFinishedNotice } from '../../server/jobs/handlers/run-finished'
import { htmlFromText } from '../../server/modules/mail/mail-html'
import { absoluteLink, configuredOrigin } from '../../server/modules/mail/mail-links'
import { mailCatcher, stopMailer } from '../../server/modules/mail/mailer'
import { sweepDigestNotice } from '../../server/modules/mail/sweep-digest'
import { closeFinishedSweeps } from '../../server/modules/sweeps/sweep-finish'
import { simulateSync } from '../../solver'
import { silentLog, useTestDb } from './helpers'
import { chipRun, newMember, queueSchemaFor, runRoutesForTest, type Member } from './runs-fixtures'
import { powerSweep, sweepsForTest } from './sweeps-fixtures'

const { db, pool } = useTestDb()
const setup = runRoutesForTest(db, pool, queueSchemaFor('sweep-mail')).then(async (r) => ({ ...r, sweeps: await sweepsForTest(db, pool, r.jobs.boss, { feedIntervalMs: 600_000 }) }))
afterAll(async () => (await setup).sweeps.module.stop())
afterAll(() => stopMailer())

const PUBLIC = 'https://sonoweave.example.org'
let app: ReturnType<typeof createApp>
let author: Member & { email: string }
const savedPublicUrl = process.env.PUBLIC_URL

beforeAll(async () => {
  // Mails from the worker side have no request to take a host from: they use PUBLIC_URL.
  process.env.PUBLIC_URL = PUBLIC
  const { routes, sweeps } = await setup
  app = createApp({ db, pool, log: silentLog, routes: [...routes, ...sweeps.routes] })
  const m = await newMember(db, 'editor', undefined, 'Ines Varga')
  const [u] = await db.select({ email: users.email }).from(users).where(eq(users.id, m.userId))
  author = { ...m, email: u.email }
})
afterAll(() => {
  if (savedPublicUrl === undefined) delete process.env.PUBLIC_URL
  else process.env.PUBLIC_URL = savedPublicUrl
})

const mailsTo = async (address: string) => (await mailCatcher())!.messages().filter((m) => m.recipients.includes(address))

/** Solves every point of the sweep as the worker would, stores it, and runs the worker's finish hook. */
async function solveAllPoints(sweepId: string): Promise<boolean[]> {
  const { rows } = await pool.query(`select id, title, config from runs where sweep_id = $1 order by sweep_point`, [sweepId])
  const sent: boolean[] = []
  for (const r of rows) {
    const result = simulateSync(SimulationConfig.parse(r.config))
    expect(result.status).toBe('finished')
    await pool.query(`update runs set status = 'succeeded', attempt = 1, progress = 1, figures = $2, started_at = now() - interval '2 seconds', finished_at = now() where id = $1`, [
      r.id,
      JSON.stringify(result.manifest.figures),
    ])
    sent.push(await mailRunOutcome(db, { runId: r.id, attempt: 1, status: 'succeeded', authorId: author.userId, title: r.title, message: 'Finished', manifest: result.manifest }))
  }
  return sent
}

describe('sweep digest mail', () => {
  it('a 20-point sweep sends its author exactly one mail, the digest, with absolute clickable links', async () => {
    const created = await request(app).post('/api/sweeps').set('Authorization', author.auth).send(powerSweep(author.groupId, 'Write power digest', 20))
    expect(created.status).toBe(202)
    const sweep = SweepDetail.parse(created.body)
    const before = (await mailsTo(author.email)).length

    const pointMails = await solveAllPoints(sweep.id)
    const closed = await closeFinishedSweeps(pool, db, silentLog, { mail: true })

    expect(pointMails).toEqual(Array(20).fill(false))
    expect(closed).toContain(sweep.id)
    const mails = (await mailsTo(author.email)).slice(0, (await mailsTo(author.email)).length - before)
    expect(mails).toHaveLength(1)
    const digest = mails[0]
    expect(digest.subject).toContain('Write power digest')
    expect(digest.text).toContain('20 of 20 points succeeded')
    expect(digest.text).toMatch(/Pulse peak power \[write\] \(W\): 0\.5 to 10 in 20 steps/)
    // The Stokes gain grows with pump power (G = g_B·P·L_eff/A_eff, Agrawal, Nonlinear Fiber Optics, ch. 9):
    // highest at the strongest pump, lowest at the weakest.
    expect(digest.text).toMatch(/highest [\d.]+ dB at point 20 \(Pulse peak power \[write\] = 10\)/)
    expect(digest.text).toMatch(/lowest +[\d.]+ dB at point 1 \(Pulse peak power \[write\] = 0\.5\)/)
    expect(digest.text).toContain(`${PUBLIC}/sweeps/${sweep.id}`)
    expect(digest.text).toContain(`${PUBLIC}/account`)
    // Every link in either part is absolute, and the HTML part makes each one an anchor.
    for (const href of digest.html!.matchAll(/href="([^"]+)"/g)) expect(href[1]).toMatch(/^https:\/\/sonoweave\.example\.org\//)
    expect(digest.html).toContain(`<a href="${PUBLIC}/sweeps/${sweep.id}">`)
    expect(digest.text).not.toMatch(/(^|\s)\/(sweeps|runs|account)\//m)

    // Closing again finds nothing to mail: the update that finished the sweep claimed its mail.
    await closeFinishedSweeps(pool, db, silentLog, { mail: true })
    expect((await mailsTo(author.email)).length - before).toBe(1)
  })

  it('sends no digest to an author who turned sweep mail off, and keeps their other settings', async () => {
    const off = await request(app).patch('/api/me').set('Authorization', author.auth).send({ notifyOnSweepFinish: false })
    expect(off.status).toBe(200)
    expect(off.body.user).toMatchObject({ notifyOnSweepFinish: false, notifyOnFinish: true, notifyOnGroupChange: true })
    const created = await request(app).post('/api/sweeps').set('Authorization', author.auth).send(powerSweep(author.groupId, 'Quiet sweep', 3))
    const sweep = SweepDetail.parse(created.body)
    const before = (await mailsTo(author.email)).length

    await solveAllPoints(sweep.id)
    expect(await closeFinishedSweeps(pool, db, silentLog, { mail: true })).toContain(sweep.id)

    expect((await mailsTo(author.email)).length).toBe(before)
  })
})

describe('single-run mail', () => {
  it('a single run mails its author once, with its real wall time and an absolute link; the setting turns it off', async () => {
    const member = await newMember(db, 'editor', author.groupId, 'Jon Aas')
    const [u] = await db.select({ email: users.email }).from(users).where(eq(users.id, member.userId))
    const made = await request(app).post('/api/runs').set('Authorization', member.auth).send({ groupId: member.groupId, title: 'Lone chip run', config: chipRun(4, 4) })
    expect(made.status).toBe(202)
    const runId = made.body.id as string
    await pool.query(`update runs set status = 'succeeded', attempt = 1, started_at = now() - interval '2.5 seconds', finished_at = now() where id = $1`, [runId])
    const outcome = { runId, attempt: 1, status: 'succeeded' as const, authorId: member.userId, title: 'Lone chip run', message: 'Finished', manifest: null }

    expect(await mailRunOutcome(db, outcome)).toBe(true)
    const [mail] = await mailsTo(u.email)
    await request(app).patch('/api/me').set('Authorization', member.auth).send({ notifyOnFinish: false })
    const sentWhenOff = await mailRunOutcome(db, outcome)

    expect(mail.subject).toBe("Finished: Run 'Lone chip run' succeeded")
    expect(mail.text).toMatch(/finished in 2\.[45] s/)
    expect(mail.html).toContain(`<a href="${PUBLIC}/runs/${runId}">`)
    expect(sentWhenOff).toBe(false)
    expect(await mailsTo(u.email)).toHaveLength(1)
  })
})

describe('digest text', () => {
  const base = {
    id: '7f0c2a52-5b8e-4a53-9f51-0d0b1f3c2a10',
    title: 'Delay scan',
    pointCount: 4,
    counts: { queued: 0, running: 0, succeeded: 3, failed: 1, cancelled: 0 },
    axisLabels: ['Write–read delay (ns)'],
    axisValues: [[2, 4, 6, 8]],
    metrics: [
      { key: 'ch0.pumpOutFwhmNs', label: 'Pump output FWHM', unit: 'ns' },
      { key: 'ch0.retrievalEfficiency', label: 'Retrieval efficiency', unit: '' },
    ],
  }
  const point = (index: number, delay: number, eff: number | null, status = 'succeeded') => ({
    index,
    values: [delay],
    runId: '00000000-0000-4000-8000-00000000000' + index,
    status,
    metrics: { 'ch0.retrievalEfficiency': eff, 'ch0.pumpOutFwhmNs': eff === null ? null : 1.5 },
  })
  const sweep = { ...base, points: [point(0, 2, 0.5), point(1, 4, 0.3), point(2, 6, null, 'failed'), point(3, 8, 0.1838)] } as unknown as SweepDetail
  const notice = sweepDigestNotice(sweep)

  it('states points done and failed, the swept range, and where the headline figure is highest and lowest', () => {
    expect(notice.title).toBe("Sweep 'Delay scan' (3/4 points, 1 failed)")
    expect(notice.summary).toContain('3 of 4 points succeeded, 1 failed')
    expect(notice.summary).toContain('Write–read delay (ns): 2 to 8 in 4 steps')
    // The efficiency ranks first among headline figures, ahead of the FWHM listed before it.
    expect(notice.summary).toMatch(/Retrieval efficiency:\n {2}highest 0\.5 {2}at point 1 \(Write–read delay = 2\)\n {2}lowest {2}0\.1838 {2}at point 4 \(Write–read delay = 8\)/)
    expect(notice.url).toBe(`/sweeps/${base.id}`)
  })

  it('tabulates every point with its status, numbered from 1', () => {
    const table = notice.summary.slice(notice.summary.indexOf('Per point:'))
    expect(table.split('\n').filter((l) => /^\d+ /.test(l))).toHaveLength(4)
    expect(table).toMatch(/^3 +6 +failed/m)
  })
})

describe('run-finished mail text', () => {
  it('shows the real duration instead of rounding a short run down to 0.0 s', () => {
    expect(formatDuration(0.038)).toBe('38 ms')
    expect(formatDuration(4.24)).toBe('4.2 s')
    expect(formatDuration(185)).toBe('3 min 05 s')
    expect(formatDuration(8040)).toBe('2 h 14 min')
    const outcome = { runId: 'r', attempt: 1, status: 'succeeded' as const, authorId: null, title: 'Chip', message: '', manifest: null }
    expect(runFinishedNotice(outcome, 0.038).summary).toContain('finished in 38 ms')
    expect(runFinishedNotice(outcome, null).summary).not.toMatch(/ in /)
  })
})

describe('links in mail', () => {
  it('take PUBLIC_URL, else the configured listener, and never stay relative', () => {
    expect(configuredOrigin({ PUBLIC_URL: 'https://sonoweave.example.org/' })).toBe('https://sonoweave.example.org')
    expect(configuredOrigin({ HOST: '0.0.0.0', PORT: '8080' })).toBe('http://localhost:8080')
    expect(configuredOrigin({ HOST: 'lab-server.local', PORT: '3001' })).toBe('http://lab-server.local:3001')
    expect(absoluteLink('/runs/abc', 'https://a.example/')).toBe('https://a.example/runs/abc')
    expect(absoluteLink('https://b.example/x', 'https://a.example')).toBe('https://b.example/x')
  })

  it('are anchors in the HTML part, with the text escaped', () => {
    const html = htmlFromText('Gain <3 dB & more.\n\nOpen it: https://a.example/runs/1?share=x&y=2\n\n-- \nSig')
    expect(html).toContain('Gain &lt;3 dB &amp; more.')
    expect(html).toContain('<a href="https://a.example/runs/1?share=x&amp;y=2">https://a.example/runs/1?share=x&amp;y=2</a>')
  })
})
