// Minimal types for the general-purpose adaptive Runge–Kutta package used as an outside reference.
declare module 'ode45-cash-karp' {
  interface Integrator {
    y: number[] | Float64Array
    t: number
    dt: number
    steps(n: number, tLimit?: number): boolean
  }
  function ode45(
    y0: number[] | Float64Array,
    deriv: (dydt: number[] | Float64Array, y: number[] | Float64Array, t: number) => void,
    t0: number,
    dt0: number,
    options?: { tol?: number; dtMaxMag?: number; verbose?: boolean },
  ): Integrator
  export default ode45
}
