import { ComponentHarness, TestKey } from '@angular/cdk/testing';
import { TroplineChartHarness } from './chart-figure-harness';

/** Test harness for `<tropline-phase-portrait>`. */
export class PhasePortraitHarness extends TroplineChartHarness {
  /** The selector this harness matches. */
  static hostSelector = 'tropline-phase-portrait';
  private readonly selects = this.locatorForAll('.tropline-phase-portrait__axes select');
  private readonly viewToggles = this.locatorForAll('mat-button-toggle button');
  private readonly canvas = this.locatorFor('.tropline-phase-portrait__canvas');
  private readonly sliders = this.locatorForAll('input[matSliderThumb]');

  /** Chooses the levels on the axes by id: across, up, and in the three-level view depth. */
  async pickLevels(x: string, y: string, depth?: string): Promise<void> {
    const selects = await this.selects();
    const wanted = [x, y, ...(depth === undefined ? [] : [depth])];
    for (const [i, id] of wanted.entries()) {
      const select = selects[i];
      if (!select) throw new Error('the three-level view is not shown: no depth select');
      const options = await this.locatorForAll(
        `.tropline-phase-portrait__axes select:nth-of-type(${i + 1}) option`,
      )();
      const values = await Promise.all(options.map((o) => o.getProperty<string>('value')));
      await select.selectOptions(values.indexOf(id));
    }
  }

  /** Switches between two levels in the plane (`plane`) and three in a box (`box`). */
  async showView(view: 'plane' | 'box'): Promise<void> {
    const toggles = await this.viewToggles();
    if (!toggles.length) throw new Error('the chain has fewer than three levels: no box view');
    await toggles[view === 'plane' ? 0 : 1]!.click();
  }

  /** Presses a key on the focused chart (the arrows turn and tilt the box, Home resets it). */
  async pressOnChart(key: 'ArrowLeft' | 'ArrowRight' | 'ArrowUp' | 'ArrowDown' | 'Home') {
    const keys = {
      ArrowLeft: TestKey.LEFT_ARROW,
      ArrowRight: TestKey.RIGHT_ARROW,
      ArrowUp: TestKey.UP_ARROW,
      ArrowDown: TestKey.DOWN_ARROW,
      Home: TestKey.HOME,
    } as const;
    const canvas = await this.canvas();
    await canvas.focus();
    await canvas.sendKeys(keys[key]);
  }

  /** The turn and tilt of the box in degrees, as its sliders show them. */
  async getViewAngles(): Promise<{ azimuth: number; elevation: number } | null> {
    const [turn, tilt] = await this.sliders();
    if (!turn || !tilt) return null;
    return {
      azimuth: Number(await turn.getProperty<string>('value')),
      elevation: Number(await tilt.getProperty<string>('value')),
    };
  }
}

/** Test harness for `<tropline-bifurcation-chart>`. */
export class BifurcationChartHarness extends TroplineChartHarness {
  /** The selector this harness matches. */
  static hostSelector = 'tropline-bifurcation-chart';
  private readonly progress = this.locatorForOptional('tropline-job-progress');
  private readonly cancelButton = this.locatorForOptional('tropline-job-progress button');
  private readonly alert = this.locatorForOptional('[role="alert"]');

  /** Whether the sweep is still running. */
  async isRunning(): Promise<boolean> {
    return (await this.progress()) !== null;
  }

  /** Cancels the running sweep. */
  async cancel(): Promise<void> {
    await (await this.cancelButton())?.click();
  }

  /** The error shown, if any. */
  async getError(): Promise<string | null> {
    return (await this.alert())?.text() ?? null;
  }
}

/** Test harness for `<tropline-regime-summary>`. */
export class RegimeSummaryHarness extends ComponentHarness {
  /** The selector this harness matches. */
  static hostSelector = 'tropline-regime-summary';
  private readonly regime = this.locatorForOptional('.tropline-regime-summary__regime');
  private readonly facts = this.locatorForAll('.tropline-regime-summary__facts > div');
  private readonly equilibria = this.locatorForAll('.tropline-regime-summary__equilibria li');

  /** The regime sentence, or null while computing. */
  async getRegime(): Promise<string | null> {
    return (await this.regime())?.text() ?? null;
  }

  /** Each fact as `label: value`. */
  async getFacts(): Promise<Record<string, string>> {
    const out: Record<string, string> = {};
    for (const fact of await this.facts()) {
      const [dt, dd] = await Promise.all([
        fact.text({ exclude: 'dd' }),
        fact.text({ exclude: 'dt' }),
      ]);
      out[dt.trim()] = dd.trim();
    }
    return out;
  }

  /** The equilibria as listed. */
  async getEquilibria(): Promise<string[]> {
    return Promise.all((await this.equilibria()).map((e) => e.text()));
  }
}

/** Test harness for `<tropline-scenario-comparison>`. */
export class ScenarioComparisonHarness extends TroplineChartHarness {
  /** The selector this harness matches. */
  static hostSelector = 'tropline-scenario-comparison';
  private readonly notable = this.locatorForAll('.tropline-scenario-comparison__notable');
  private readonly heads = this.locatorForAll('.tropline-scenario-comparison__metrics thead th');

  /** Column headings of the metrics table. */
  async getScenarioNames(): Promise<string[]> {
    return (await Promise.all((await this.heads()).map((h) => h.text()))).slice(2);
  }

  /** Texts of the highlighted cells. */
  async getNotableCells(): Promise<string[]> {
    return Promise.all((await this.notable()).map((c) => c.text()));
  }
}

/** Test harness for `<tropline-parameter-form>`. */
export class ParameterFormHarness extends ComponentHarness {
  /** The selector this harness matches. */
  static hostSelector = 'tropline-parameter-form';
  private readonly inputs = this.locatorForAll('input[type="number"]');
  private readonly legends = this.locatorForAll('legend');
  private readonly errors = this.locatorForAll('mat-error');
  private readonly fixed = this.locatorForAll('.tropline-parameter-form__fixed');
  private readonly resetButton = this.locatorFor('.tropline-parameter-form__actions button');

  /** The group legends, producer first. */
  async getGroups(): Promise<string[]> {
    return Promise.all((await this.legends()).map((l) => l.text()));
  }

  /** Number of editable fields. */
  async getEditableCount(): Promise<number> {
    return (await this.inputs()).length;
  }

  /** Number of values shown as fixed by the publisher. */
  async getFixedCount(): Promise<number> {
    return (await this.fixed()).length;
  }

  /** Types a value into the numeric field whose label starts with `label`. */
  async setValue(label: string, value: string): Promise<void> {
    const input = await this.field(label);
    await input.clear();
    await input.sendKeys(value);
    await input.blur();
  }

  /** The ids of the numeric fields in order, e.g. `tropline-param-levels-1-handlingTime`. */
  async getFieldIds(): Promise<string[]> {
    return Promise.all((await this.inputs()).map(async (i) => (await i.getAttribute('id')) ?? ''));
  }

  /** The id of the numeric field whose label starts with `label`. */
  async getFieldId(label: string): Promise<string> {
    return (await (await this.field(label)).getAttribute('id')) ?? '';
  }

  /** Whether the field whose label starts with `label` is marked invalid (`aria-invalid`). */
  async isFieldInvalid(label: string): Promise<boolean> {
    return (await (await this.field(label)).getAttribute('aria-invalid')) === 'true';
  }

  /**
   * The message tied to the field whose label starts with `label` by `aria-describedby` (its
   * error, the form's own or the server's), or null when it has none.
   */
  async getFieldError(label: string): Promise<string | null> {
    const input = await this.field(label);
    const ids = ((await input.getAttribute('aria-describedby')) ?? '').split(' ');
    const id = ids.find((i) => i.endsWith('-error'));
    if (!id) return null;
    const error = await this.documentRootLocatorFactory().locatorForOptional(`#${id}`)();
    return error ? (await error.text()).trim() || null : null;
  }

  /** Whether the form's values are ones the form and the model accept. */
  async isValid(): Promise<boolean> {
    return !(await (await this.host()).hasClass('tropline-parameter-form--invalid'));
  }

  /** Validation messages on screen. */
  async getErrors(): Promise<string[]> {
    return (await Promise.all((await this.errors()).map((e) => e.text()))).filter(Boolean);
  }

  /** Resets to the published values. */
  async reset(): Promise<void> {
    await (await this.resetButton()).click();
  }

  private async field(label: string) {
    for (const input of await this.inputs()) {
      const id = await input.getAttribute('id');
      const labelEl = await this.documentRootLocatorFactory().locatorForOptional(
        `label[for="${id}"]`,
      )();
      if (labelEl && (await labelEl.text()).startsWith(label)) return input;
    }
    throw new Error(`no field labelled "${label}"`);
  }
}
