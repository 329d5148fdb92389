// The demo workspace: a fictional research group with one member per role. Safe to run repeatedly.
import { fileURLToPath } from 'node:url'
import bcrypt from 'bcryptjs'
import { sql } from 'drizzle-orm'
import { createDb, createPool, type Db } from './client'
import { describeDbError } from './describe-error'
import { groups, memberships, users, type MembershipRole } from './schema'
import { seedDemoWaveguides } from './seed-waveguides'

export const DEMO_GROUP = { name: 'Halden Acousto-Optics Lab', slug: 'halden-lab' } as const

/** Demo sign-ins, also listed in README.md. Demo only: never reuse these anywhere real. */
export const DEMO_ACCOUNTS: ReadonlyArray<{ email: string; name: string; password: string; role: MembershipRole; isAdmin?: boolean }> = [
  { email: 'ingrid@halden-lab.example', name: 'Ingrid Solvang', password: 'demo-password-1', role: 'owner', isAdmin: true },
  { email: 'tomas@halden-lab.example', name: 'Tomas Reyes', password: 'demo-password-2', role: 'editor' },
  { email: 'mei@halden-lab.example', name: 'Mei Okafor', password: 'demo-password-3', role: 'viewer' },
]

// bcrypt cost 10: about 60 ms a hash here; enough for demo rows.
const BCRYPT_COST = 10

/** Inserts whatever part of the demo is missing; existing rows (and changed passwords) are left alone. */
export async function seedDemo(db: Db): Promise<{ created: number; waveguides: number }> {
  let created = 0
  let waveguideCount = 0
  await db.transaction(async (tx) => {
    await tx.insert(groups).values(DEMO_GROUP).onConflictDoNothing({ target: groups.slug })
    const [group] = await tx.select().from(groups).where(sql`${groups.slug} = ${DEMO_GROUP.slug}`)

    for (const account of DEMO_ACCOUNTS) {
      let [user] = await tx.select().from(users).where(sql`lower(${users.email}) = lower(${account.email})`)
      if (!user) {
        const passwordHash = await bcrypt.hash(account.password, BCRYPT_COST)
        ;[user] = await tx
          .insert(users)
          .values({ email: account.email, name: account.name, passwordHash, emailConfirmedAt: new Date(), isAdmin: account.isAdmin ?? false })
          .returning()
        created++
      } else if (account.isAdmin && !user.isAdmin) {
        // Databases seeded before the admin flag existed get it too.
        await tx.update(users).set({ isAdmin: true }).where(sql`${users.id} = ${user.id}`)
      }
      await tx.insert(memberships).values({ userId: user.id, groupId: group.id, role: account.role }).onConflictDoNothing()
    }
    if (created > 0) {
      // Only with a new workspace: a library the group has since edited is theirs.
      const [editor] = await tx.select().from(users).where(sql`lower(${users.email}) = lower(${DEMO_ACCOUNTS[1].email})`)
      waveguideCount = await seedDemoWaveguides(tx, group.id, editor.id)
    }
  })
  return { created, waveguides: waveguideCount }
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const { loadDatabaseUrl } = await import('../env')
  const url = loadDatabaseUrl()
  const pool = createPool(url, { max: 1, applicationName: 'sonoweave-seed' })
  try {
    const { created } = await seedDemo(createDb(pool))
    console.log(created ? `db: demo workspace seeded (${created} accounts)` : 'db: demo workspace already present')
  } catch (err) {
    console.error(`db: seeding failed: ${describeDbError(err, url)}`)
    process.exitCode = 1
  } finally {
    await pool.end()
  }
}
