import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { checkLimits, estimateResources } from '@shared/physics/resource-estimate'
import { REPO } from './run-cli'

const dir = join(REPO, 'solver/examples')
const files = readdirSync(dir).filter((f) => f.endsWith('.json'))
/** Demo runs are seeded on start-up, so each must take seconds at most: 1e8 cell-updates ≈ 3 s at 30 M/s. */
const DEMO_MAX_CELL_UPDATES = 1e8

describe('solver/examples', () => {
  it('holds at least five scenarios', () => {
    expect(files.length).toBeGreaterThanOrEqual(5)
  })

  it.each(files)('%s parses, is within the default limits and small enough for a demo', (f) => {
    const parsed = SimulationConfig.safeParse(JSON.parse(readFileSync(join(dir, f), 'utf8')))
    expect(parsed.error?.issues ?? []).toEqual([])
    const config = parsed.data!
    const e = estimateResources(config, chooseGrid(config))
    expect(checkLimits(e)).toEqual({ ok: true })
    expect(e.cellUpdates).toBeLessThan(DEMO_MAX_CELL_UPDATES)
  })

  it('covers the store-and-retrieve roles: data and refresh in the pump role, write and read in the Stokes role', () => {
    const labels = (f: string, port: 'pump' | 'stokes') =>
      SimulationConfig.parse(JSON.parse(readFileSync(join(dir, f), 'utf8'))).channels[0][port].pulses.map((p) => p.label)
    expect(labels('store-refresh-retrieve-chalcogenide-rib.json', 'pump')).toEqual(['data', 'refresh', 'refresh', 'refresh'])
    expect(labels('store-refresh-retrieve-chalcogenide-rib.json', 'stokes')).toEqual(['write', 'read'])
    const ho = SimulationConfig.parse(JSON.parse(readFileSync(join(dir, 'storage-150ps-higher-order.json'), 'utf8')))
    expect(ho.options.higherOrderAcoustic).toBe(true)
  })
})
