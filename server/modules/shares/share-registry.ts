import type { Db } from '../../db/client'

export interface Shareable {
  /** The group that owns the resource, or null when there is no such resource. */
  groupOf(db: Db, id: string): Promise<string | null>
  /** Client path of the resource's page, so a new link can be shown whole (the token goes in ?share=). */
  pathOf?(id: string): string
}

const registry = new Map<string, Shareable>()

/**
 * Lets a module's resources get share links: `registerShareable('run', { groupOf })`. Register at
 * module load (next to the module's routes); registering a name twice replaces the first.
 */
export function registerShareable(type: string, shareable: Shareable): void {
  registry.set(type, shareable)
}

export function shareableOf(type: string): Shareable | undefined {
  return registry.get(type)
}

export function shareableTypes(): string[] {
  return [...registry.keys()].sort()
}
