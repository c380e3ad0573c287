import { TroplineChartHarness } from './chart-figure-harness';

/** Test harness for `<tropline-trajectory-chart>`. */
export class TrajectoryChartHarness extends TroplineChartHarness {
  /** The selector this harness matches. */
  static hostSelector = 'tropline-trajectory-chart';
}
