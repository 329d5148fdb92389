// People in a real browser: a signed-out visitor following a link to a group's run is asked to sign in
// and comes back to the run; share links say who can open them; an invitation link prefills the
// sign-up form and the address it went to needs no second confirmation.
import { readFileSync } from 'node:fs'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { newSecretToken } from '../../server/modules/auth/secret-token'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
const dbUrl = inject('e2eDatabaseUrl')
let browser: Browser
const contexts: BrowserContext[] = []
const pool = new pg.Pool({ connectionString: dbUrl, max: 2 })

async function freshPage(theme: 'light' | 'dark' = 'light'): Promise<Page> {
  const ctx = await newContext(browser, base, theme)
  contexts.push(ctx)
  return ctx.newPage()
}

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {})
  await browser?.close()
  await pool.end()
})

describe('links to a group’s run', () => {
  const title = 'E2E shared store and retrieve'
  let runId = ''
  let membersLink = ''
  let publicLink = ''

  it('the share dialog says who can open each kind of link', async () => {
    const editor = await freshPage()
    await signIn(editor, DEMO.editor)
    const me = await (await editor.request.get('/api/me')).json()
    const config = JSON.parse(readFileSync('solver/examples/store-and-retrieve-chalcogenide-rib.json', 'utf8'))
    const res = await editor.request.post('/api/runs', { data: { groupId: me.currentGroupId ?? me.memberships[0].groupId, title, config } })
    expect(res.status()).toBe(202)
    runId = (await res.json()).id

    await editor.goto(`/runs/${runId}`)
    await editor.getByRole('button', { name: 'Share' }).click()
    const dialog = editor.getByRole('dialog')
    await dialog.getByRole('button', { name: 'Make link' }).click()
    membersLink = await dialog.locator('[data-test=share-url] input').inputValue()
    expect(await dialog.locator('[data-test=share-who]').innerText()).toMatch(/Anyone signed in to Sonoweave who has this link can open the run.*asked to sign in/s)
    await screenshot(editor, 'share-dialog-members')

    await dialog.getByLabel('Anyone who has the link, no account needed').check()
    await dialog.getByRole('button', { name: 'Make link' }).click()
    await dialog.locator('[data-test=share-who]', { hasText: 'without an account' }).waitFor()
    // The text field takes its new value a render after the sentence: wait for it rather than read it once.
    const urlInput = dialog.locator('[data-test=share-url] input')
    for (let tries = 0; (publicLink = await urlInput.inputValue()) === membersLink && tries < 100; tries++) await editor.waitForTimeout(100)
    expect(publicLink).not.toBe(membersLink)
    expect(new URL(membersLink).pathname).toBe(`/runs/${runId}`)
  })

  it('a signed-out visitor of the run is asked to sign in and lands on the run afterwards, not on "not found"', async () => {
    const page = await freshPage()
    await page.goto(`/runs/${runId}`)
    await page.waitForURL(/\/sign-in\?/)
    await page.locator('[data-test=sign-in-prompt]', { hasText: 'belongs to a research group' }).waitFor()
    await screenshot(page, 'sign-in-prompt-group-run')
    await page.getByLabel('E-mail').fill(DEMO.viewer.email)
    await page.getByLabel('Password', { exact: true }).fill(DEMO.viewer.password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL((u) => u.pathname === `/runs/${runId}`, { timeout: 20_000 })
    await page.getByText(title).first().waitFor()
    expect(await page.getByText(/not found/i).count()).toBe(0)
  })

  it('a members-only share link asks a signed-out visitor to sign in, then opens; a public one opens at once', async () => {
    const page = await freshPage('dark')
    await page.goto(membersLink)
    await page.waitForURL(/\/sign-in\?/)
    await page.locator('[data-test=sign-in-prompt]', { hasText: 'only for people signed in' }).waitFor()
    await screenshot(page, 'sign-in-prompt-share-link-dark')
    await page.getByLabel('E-mail').fill(DEMO.viewer.email)
    await page.getByLabel('Password', { exact: true }).fill(DEMO.viewer.password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL((u) => u.pathname === `/runs/${runId}` && u.searchParams.has('share'), { timeout: 20_000 })
    await page.getByText(title).first().waitFor()

    const anonymous = await freshPage()
    await anonymous.goto(publicLink)
    await anonymous.getByText(title).first().waitFor()
    expect(new URL(anonymous.url()).pathname).toBe(`/runs/${runId}`)
  })
})

describe('invitation sign-up', () => {
  it('prefills the invited address; signing up with it confirms it, with no confirmation mail', async () => {
    const email = `invitee-${Date.now()}@halden-lab.example`
    const { rows: owner } = await pool.query(`select u.id, m.group_id from users u join memberships m on m.user_id = u.id where u.email = 'ingrid@halden-lab.example' and m.role = 'owner' limit 1`)
    const { token, hash } = newSecretToken('inv_')
    // The token goes only by mail, which this process cannot read: the row is made as invite() makes it.
    await pool.query(`insert into invitations (group_id, email, role, token_hash, invited_by, expires_at) values ($1, $2, 'editor', $3, $4, now() + interval '7 days')`, [owner[0].group_id, email, hash, owner[0].id])

    const page = await freshPage()
    await page.goto(`/accept-invite?token=${encodeURIComponent(token)}`)
    await page.getByRole('link', { name: `Create an account for ${email}` }).click()
    await page.waitForURL(/\/sign-up\?/)
    expect(await page.getByLabel('E-mail').inputValue()).toBe(email)
    await page.getByText('needs no further confirmation').waitFor()
    await screenshot(page, 'sign-up-from-invitation')
    await page.getByLabel('Your name').fill('Aino Lindqvist')
    await page.getByLabel('Password', { exact: true }).fill('a long invited passphrase')
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.waitForURL((u) => u.pathname === '/accept-invite', { timeout: 20_000 })
    await page.getByRole('button', { name: 'Join the group' }).click()
    await page.waitForURL((u) => u.pathname === '/group', { timeout: 20_000 })

    const { rows } = await pool.query(
      `select u.email_confirmed_at, (select count(*)::int from email_confirmations c where c.user_id = u.id) as links, (select role from memberships m where m.user_id = u.id) as role from users u where u.email = $1`,
      [email],
    )
    expect(rows[0].email_confirmed_at).not.toBeNull()
    expect(rows[0].links).toBe(0)
    expect(rows[0].role).toBe('editor')
  })
})

describe('account page', () => {
  it('changes which mails come, and names the wrong current password at its field', async () => {
    const email = `account-${Date.now()}@halden-lab.example`
    const page = await freshPage()
    await page.goto('/sign-up')
    await page.getByLabel('E-mail').fill(email)
    await page.getByLabel('Password', { exact: true }).fill('an account passphrase')
    await page.getByRole('button', { name: 'Create account' }).click()
    await page.waitForURL((u) => !u.pathname.startsWith('/sign-up'), { timeout: 20_000 })

    await page.goto('/account')
    await page.getByLabel('A sweep of mine finished').uncheck()
    await expect.poll(async () => (await (await page.request.get('/api/me')).json()).user.notifyOnSweepFinish).toBe(false)
    expect((await (await page.request.get('/api/me')).json()).user).toMatchObject({ notifyOnFinish: true, notifyOnGroupChange: true })

    const passwordCard = page.locator('.v-card', { hasText: 'Change password' })
    await passwordCard.getByLabel('Current password').fill('not my password at all')
    await passwordCard.getByLabel('New password').fill('a newer account passphrase')
    await passwordCard.getByRole('button', { name: 'Change password' }).click()
    await passwordCard.getByText('This is not your current password').waitFor()
    await screenshot(page, 'account-page')

    for (const [theme, width] of [['dark', 390], ['light', 390]] as const) {
      const ctx = await newContext(browser, base, theme, page.context())
      contexts.push(ctx)
      const phone = await ctx.newPage()
      await phone.setViewportSize({ width, height: 844 })
      await phone.goto('/account')
      await phone.getByText('Mail me when').waitFor()
      const overflow = await phone.evaluate<number>('document.documentElement.scrollWidth - window.innerWidth')
      expect(overflow).toBeLessThanOrEqual(0)
      await screenshot(phone, `account-page-${width}-${theme}`)
    }
  })
})
