// The document's operations grouped by tag, in the document's tag order, filtered by a search text.
import type { OpenApiDocument, OpenApiOperation } from '@/api/openapi'

export interface ListedOperation {
  id: string
  method: string
  path: string
  op: OpenApiOperation
}

export interface OperationGroup {
  tag: string
  description?: string
  operations: ListedOperation[]
}

const METHOD_ORDER = ['get', 'post', 'put', 'patch', 'delete']

export function groupOperations(doc: OpenApiDocument, search = ''): OperationGroup[] {
  const needle = search.trim().toLowerCase()
  const byTag = new Map<string, ListedOperation[]>()
  for (const [path, ops] of Object.entries(doc.paths)) {
    for (const [method, op] of Object.entries(ops)) {
      const text = `${method} ${path} ${op.summary} ${op.tags.join(' ')}`.toLowerCase()
      if (needle && !needle.split(/\s+/).every((w) => text.includes(w))) continue
      const tag = op.tags[0] ?? 'Other'
      const list = byTag.get(tag) ?? []
      list.push({ id: op.operationId ?? `${method} ${path}`, method, path, op })
      byTag.set(tag, list)
    }
  }
  const order = doc.tags.map((t) => t.name)
  const rank = (tag: string) => (order.includes(tag) ? order.indexOf(tag) : order.length)
  return [...byTag.entries()]
    .sort(([a], [b]) => rank(a) - rank(b))
    .map(([tag, operations]) => ({
      tag,
      description: doc.tags.find((t) => t.name === tag)?.description,
      operations: operations.sort((a, b) => a.path.localeCompare(b.path) || METHOD_ORDER.indexOf(a.method) - METHOD_ORDER.indexOf(b.method)),
    }))
}
