import { ComponentHarness } from '@angular/cdk/testing';

/** Test harness for `<tropline-trajectory-chart>`. */
export class TrajectoryChartHarness extends ComponentHarness {
  /** The selector this harness matches. */
  static hostSelector = 'tropline-trajectory-chart';

  private readonly summary = this.locatorFor('figcaption');
  private readonly canvas = this.locatorFor('.tropline-trajectory-chart__canvas');

  /** The sentence that describes the chart to assistive technology. */
  async getSummary(): Promise<string> {
    return (await this.summary()).text();
  }

  /** The chart's accessible name. */
  async getLabel(): Promise<string | null> {
    return (await this.canvas()).getAttribute('aria-label');
  }
}
