// What differs between the configurations of several runs: every setting whose value is not the same in all
// of them, named in words (shared/api/issue-path-labels.ts) with its unit, one value per run ("—" where a run
// does not have the setting, e.g. a pulse only one run launches). Settings equal in every run are left out.
import { describeIssuePath } from '../api/issue-path-labels'
import { unitOfKey } from '../api/key-units'

export { unitOfKey }

export interface DiffRow {
  /** Dotted path, stable for keys and tests. */
  path: string
  label: string
  unit: string
  /** One text per run, in the order given. */
  values: string[]
}

type Leaf = string | number | boolean | null

function leaves(x: unknown, path: (string | number)[], out: Map<string, { path: (string | number)[]; value: Leaf }>): void {
  if (Array.isArray(x)) {
    // A long sampled shape is one setting, not thousands.
    if (x.length > 16 && x.every((v) => typeof v === 'number')) {
      out.set(path.join('.'), { path, value: `${x.length} samples, sum ${Number((x as number[]).reduce((a, b) => a + b, 0).toPrecision(6))}` })
      return
    }
    x.forEach((v, i) => leaves(v, [...path, i], out))
  } else if (x !== null && typeof x === 'object') {
    for (const [k, v] of Object.entries(x)) leaves(v, [...path, k], out)
  } else if (x !== undefined) {
    out.set(path.join('.'), { path, value: x as Leaf })
  }
}

const show = (v: Leaf | undefined) => (v === undefined ? '—' : typeof v === 'number' ? String(Number(v.toPrecision(6))) : typeof v === 'boolean' ? (v ? 'on' : 'off') : String(v))

export function configDiff(configs: unknown[]): DiffRow[] {
  const maps = configs.map((c) => {
    const m = new Map<string, { path: (string | number)[]; value: Leaf }>()
    leaves(c, [], m)
    return m
  })
  const channelCount = Math.max(1, ...configs.map((c) => ((c as { channels?: unknown[] })?.channels?.length ?? 1)))
  const order: string[] = []
  const seen = new Set<string>()
  for (const m of maps) for (const k of m.keys()) if (!seen.has(k)) (seen.add(k), order.push(k))
  const rows: DiffRow[] = []
  for (const key of order) {
    const vals = maps.map((m) => m.get(key))
    const first = JSON.stringify(vals[0]?.value)
    if (vals.every((v) => JSON.stringify(v?.value) === first)) continue
    const path = vals.find((v) => v)!.path
    const last = path[path.length - 1]
    rows.push({ path: key, label: describeIssuePath(path, channelCount), unit: typeof last === 'string' ? unitOfKey(last) : '', values: vals.map((v) => show(v?.value)) })
  }
  return rows
}
