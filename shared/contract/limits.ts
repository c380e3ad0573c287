/**
 * Hard bounds on every computation the engine runs. The server may lower them per tenant but
 * never raise them; past a bound the engine answers with a typed error, never a hang.
 */
export const ENGINE_LIMITS = {
  /** Fewest levels in a chain (producer + one consumer). */
  minLevels: 2,
  /** Most levels in a chain. */
  maxLevels: 4,
  /** Largest magnitude accepted for any parameter, initial state or stocking/harvest amount. */
  maxParameterMagnitude: 1e12,
  /** Longest projection horizon, in model time units. */
  maxHorizon: 100_000,
  /** Most sample points in one projection response. */
  maxSamples: 20_001,
  /** Fewest sample points (t = 0 and t = horizon). */
  minSamples: 2,
  /** Default sample count when a request gives none. */
  defaultSamples: 201,
  /** Default relative tolerance (the absolute floor matches it, see shared/README.md). */
  defaultTolerance: 1e-8,
  /** Loosest relative tolerance accepted. */
  maxTolerance: 1e-3,
  /** Tightest relative tolerance accepted (ODEX's extrapolation stops gaining below this). */
  minTolerance: 1e-13,
  /** Most integrator steps for one projection. */
  maxSteps: 2_000_000,
  /** Default wall-time budget for one projection, in milliseconds. */
  defaultWallTimeMs: 10_000,
  /** Most characters in a level id. */
  maxIdLength: 40,
  /** Most characters in a name, a unit or the time unit. */
  maxLabelLength: 120,
} as const;
