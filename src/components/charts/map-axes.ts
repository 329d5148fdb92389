// Axis units for the maps and traces: pick the unit that keeps the numbers short for the span shown.

export interface AxisUnit {
  unit: string
  /** Multiply a value in base units (m, ns) by this to get the shown unit. */
  factor: number
}

export function lengthUnit(spanM: number): AxisUnit {
  if (spanM < 0.5) return { unit: 'mm', factor: 1e3 }
  if (spanM < 2000) return { unit: 'm', factor: 1 }
  return { unit: 'km', factor: 1e-3 }
}

export function timeUnit(spanNs: number): AxisUnit {
  if (spanNs < 2000) return { unit: 'ns', factor: 1 }
  if (spanNs < 2e6) return { unit: 'µs', factor: 1e-3 }
  return { unit: 'ms', factor: 1e-6 }
}
