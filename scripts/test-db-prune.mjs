// Test databases kept after a failure are dropped once they are a day old, so they do not pile up.
import { defaultCluster, dropDb, listDatabases } from './db.mjs'

const KEEP_MS = 24 * 3600 * 1000
const NAME = /^sonoweave_test_(\d{4})(\d{2})(\d{2})(\d{2})(\d{2})(\d{2})_[0-9a-f]+$/

export function pruneOldTestDatabases(cluster = defaultCluster(), now = Date.now()) {
  const dropped = []
  for (const name of listDatabases(cluster)) {
    const m = NAME.exec(name)
    if (!m) continue
    const made = Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6])
    if (now - made > KEEP_MS) {
      dropDb(name, cluster)
      dropped.push(name)
    }
  }
  return dropped
}
