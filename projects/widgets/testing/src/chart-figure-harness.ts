import { ComponentHarness } from '@angular/cdk/testing';

/** Shared parts of every Tropline chart: summary, accessible name, table view. */
export abstract class TroplineChartHarness extends ComponentHarness {
  private readonly caption = this.locatorFor('figcaption');
  private readonly toggle = this.locatorFor('.tropline-chart-figure__table-toggle');
  private readonly canvasRole = this.locatorFor('[role="img"]');
  private readonly headers = this.locatorForAll('.tropline-chart-figure__table thead th');
  private readonly rowsOf = this.locatorForAll('.tropline-chart-figure__table tbody tr');

  /** The sentence that describes the chart to assistive technology. */
  async getSummary(): Promise<string> {
    return (await this.caption()).text();
  }

  /** The chart's accessible name. */
  async getLabel(): Promise<string | null> {
    return (await this.canvasRole()).getAttribute('aria-label');
  }

  /** Whether the chart can take keyboard focus. */
  async isFocusable(): Promise<boolean> {
    return (await (await this.canvasRole()).getAttribute('tabindex')) === '0';
  }

  /** Whether the table view is open. */
  async isTableShown(): Promise<boolean> {
    return (await (await this.toggle()).getAttribute('aria-expanded')) === 'true';
  }

  /** Opens or closes the table view. */
  async toggleTable(): Promise<void> {
    await (await this.toggle()).click();
  }

  /** Column headings of the open table. */
  async getTableHeadings(): Promise<string[]> {
    return Promise.all((await this.headers()).map((h) => h.text()));
  }

  /** Number of rows of the open table. */
  async getTableRowCount(): Promise<number> {
    return (await this.rowsOf()).length;
  }
}
