import { customType, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { runs } from './runs'

export const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' })

export const arrayDtype = pgEnum('array_dtype', ['c16', 'f8', 'f4'])

/**
 * Final result arrays, little-endian raw bytes in C order. Keyed by attempt so a retried run never mixes
 * two attempts; readers take the attempt on the run row. All arrays of an attempt are written in one
 * transaction together with the run's status, so a half set is never visible.
 */
export const runArrays = pgTable(
  'run_arrays',
  {
    runId: uuid('run_id')
      .notNull()
      .references(() => runs.id, { onDelete: 'cascade' }),
    attempt: integer('attempt').notNull(),
    name: text('name').notNull(),
    dtype: arrayDtype('dtype').notNull(),
    shape: jsonb('shape').$type<number[]>().notNull(),
    units: text('units').notNull(),
    description: text('description').notNull(),
    data: bytea('data').notNull(),
  },
  (t) => [primaryKey({ columns: [t.runId, t.attempt, t.name] })],
)

/** Space–time map rows streamed while a run computes (float32, rowCount × cols each). */
export const runMapBlocks = pgTable(
  'run_map_blocks',
  {
    runId: uuid('run_id')
      .notNull()
      .references(() => runs.id, { onDelete: 'cascade' }),
    attempt: integer('attempt').notNull(),
    blockIndex: integer('block_index').notNull(),
    rowStart: integer('row_start').notNull(),
    rowCount: integer('row_count').notNull(),
    cols: integer('cols').notNull(),
    pumpPowerW: bytea('pump_power_w').notNull(),
    stokesPowerW: bytea('stokes_power_w').notNull(),
    acousticPhononsPerM: bytea('acoustic_phonons_per_m').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.runId, t.attempt, t.blockIndex] })],
)
