// Gives every vitest run a throwaway, migrated database. `npm test` creates one itself and passes
// TEST_DATABASE_URL; a direct `npx vitest run …` gets one here. A DATABASE_URL already in the
// shell is deliberately ignored: tests never touch the demo or any other real database.
import type { TestProject } from 'vitest/node'
import { createDb, databaseUrl, dropDb, start, testDatabaseName } from '../../scripts/db.mjs'
import { migrateDatabase } from '../../server/db/migrate'
import { createTemplate, dropDatabaseAt, TEMPLATE_ENV } from './file-database'

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string
  }
}

export default async function setup(project: TestProject): Promise<(() => void) | undefined> {
  const given = process.env.TEST_DATABASE_URL
  if (given) {
    process.env.DATABASE_URL = given
    project.provide('databaseUrl', given)
    const templateUrl = createTemplate(given)
    process.env[TEMPLATE_ENV] = templateUrl
    return () => dropDatabaseAt(templateUrl)
  }

  await start(undefined, { quiet: true, database: null })
  const name = testDatabaseName()
  createDb(name)
  const url = databaseUrl(name)
  await migrateDatabase(url)
  // Workers start after global setup and inherit this environment.
  process.env.TEST_DATABASE_URL = url
  process.env.DATABASE_URL = url
  project.provide('databaseUrl', url)
  const templateUrl = createTemplate(url)
  process.env[TEMPLATE_ENV] = templateUrl

  return () => {
    dropDatabaseAt(templateUrl)
    if (project.vitest.state.getCountOfFailedTests() > 0) {
      console.log(`kept test database ${name} for inspection (drop it with: node scripts/db.mjs drop-db ${name})`)
    } else {
      dropDb(name)
    }
  }
}
