// Floors of the time grid, shared by the config schema (form and API), the step rules and the resource
// estimate, so a window or step the solver cannot use is refused before a run is queued.

/**
 * Smallest time step (ps). The envelope equations assume envelopes that vary slowly over an optical
 * period (about 5 fs at 1550 nm; slowly varying envelope approximation, common practice), so a step
 * below 1 fs resolves nothing the model describes; it only multiplies the cost.
 */
export const MIN_TIME_STEP_PS = 1e-3

/** Steps the automatic grid puts in a window at least (shared/physics/grid-step.ts GRID_RULES.minSteps). */
export const MIN_AUTO_STEPS = 200

/** Steps a window must hold with a step the user chose; fewer is not a time trace (common practice). */
export const MIN_WINDOW_STEPS = 10

/** Shortest window (ns): the automatic grid's minimum number of steps at the smallest step. */
export const MIN_WINDOW_NS = (MIN_AUTO_STEPS * MIN_TIME_STEP_PS) / 1000
