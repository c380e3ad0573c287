// ode45-cash-karp 1.1.0 ships no types; only what the reference tests use.
declare module 'ode45-cash-karp' {
  interface Integrator {
    y: number[];
    t: number;
    dt: number;
    step(tLimit?: number): boolean;
    steps(n: number, tLimit?: number): boolean;
  }
  function ode45(
    y0: number[],
    deriv: (dydt: number[], y: number[], t: number) => void,
    t0: number,
    dt0: number,
    options?: { tol?: number; dtMaxMag?: number; dtMinMag?: number; verbose?: boolean },
  ): Integrator;
  export default ode45;
}
