// Validation issues of the shared schemas, keyed by field path, handed down to the fields that show them.
// A form provides the map once; every field looks up its own path, so no field needs the whole schema.
import { computed, inject, provide, unref, type ComputedRef, type InjectionKey, type MaybeRef } from 'vue'

export type FieldPath = readonly (string | number)[]
export type IssueMap = Readonly<Record<string, string[]>>

interface SchemaIssue {
  path: readonly PropertyKey[]
  message: string
}

export const pathKey = (path: readonly PropertyKey[]): string => path.map(String).join('.')

/** Groups messages by their path ("channels.0.pump.pulses.1.centreNs"), without repeats. */
export function issuesByPath(issues: readonly SchemaIssue[]): Record<string, string[]> {
  const out: Record<string, string[]> = {}
  for (const issue of issues) {
    const key = pathKey(issue.path)
    const list = (out[key] ??= [])
    if (!list.includes(issue.message)) list.push(issue.message)
  }
  return out
}

interface IssueContext {
  map: ComputedRef<IssueMap>
  /** Path of the provider's root inside the map (e.g. ['waveguide'] when a config map serves a waveguide editor). */
  prefix: FieldPath
}

const KEY: InjectionKey<IssueContext> = Symbol('form-issues')

export function provideIssues(map: MaybeRef<IssueMap> | (() => IssueMap), prefix: FieldPath = []): void {
  provide(KEY, { map: computed(() => (typeof map === 'function' ? map() : unref(map))), prefix })
}

/** Messages for one field; an empty list outside any provider. */
export function useIssueLookup(): (path: FieldPath) => string[] {
  const ctx = inject(KEY, null)
  return (path) => (ctx ? (ctx.map.value[pathKey([...ctx.prefix, ...path])] ?? []) : [])
}

/** Every issue at or below a path (to open a collapsed section that hides an error). */
export function useIssuesUnder(): (path: FieldPath) => number {
  const ctx = inject(KEY, null)
  return (path) => {
    if (!ctx) return 0
    const key = pathKey([...ctx.prefix, ...path])
    return Object.entries(ctx.map.value).filter(([k]) => k === key || k.startsWith(`${key}.`)).reduce((n, [, v]) => n + v.length, 0)
  }
}
