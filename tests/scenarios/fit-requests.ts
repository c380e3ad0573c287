/**
 * Calibration bodies the scenario tests send to the seeded demo scenarios (dataset version 1
 * of each is its synthetic survey file).
 */

/** Hobcairn Moor: the deer's attack rate and mortality, two starts; finishes in seconds. */
export const MOOR_FIT = {
  dataset: 1,
  parameters: [
    { pointer: '/levels/1/attackRate', min: 0.01, max: 1 },
    { pointer: '/levels/1/mortality', min: 0.05, max: 1.5 },
  ],
  starts: 2,
};

/**
 * Brackenlow Mere in segments with every start and iteration: minutes of work, for tests that
 * cancel a calibration or need one to hold a calibration thread. `variant` changes the body
 * (identical bodies would join one job).
 */
export function longMereFit(variant = 0) {
  return {
    dataset: 1,
    parameters: [
      { pointer: '/levels/1/mortality', min: 0.4, max: 1.6 },
      { pointer: '/levels/2/mortality', min: 0.005, max: 0.08 },
    ],
    segmentLength: 20,
    starts: 8,
    maxIterations: 200 - variant,
  };
}
