import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { project, type ProjectionResponse } from '@tropline/core';
import { CautionNotice, TrajectoryChart, type TrajectoryData } from '@tropline/widgets';
import type { DatasetWithSeries, ScenarioContent } from './scenario-types';

/**
 * The version's projection drawn with the library's trajectory chart and its cautions. It is
 * computed in the browser with the same engine the API runs, so previewing costs no compute
 * units and needs no key; monitoring data, when chosen, are drawn over it.
 */
@Component({
  selector: 'tc-projection-preview',
  imports: [TrajectoryChart, CautionNotice],
  template: `
    @if (outcome(); as o) {
      @if (o.error) {
        <p class="tc-preview-error" role="alert">
          This version cannot be projected: {{ o.error }} Save a version with other values.
        </p>
      } @else {
        <tropline-trajectory-chart
          [data]="data()"
          [label]="
            'Projection of ' +
            content().name +
            ' over ' +
            content().horizon +
            ' ' +
            content().model.timeUnit
          "
          [fileName]="'tropline-preview'"
        />
        <tropline-caution-notice [cautions]="o.result!.cautions" />
      }
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .tc-preview-error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectionPreview {
  /** The version to project. */
  readonly content = input.required<ScenarioContent>();
  /** Monitoring data to draw over the projection, if any. */
  readonly observations = input<DatasetWithSeries | undefined>(undefined);

  protected readonly outcome = computed((): { result?: ProjectionResponse; error?: string } => {
    const c = this.content();
    try {
      return {
        result: project({ model: c.model, initial: c.initial, horizon: c.horizon, samples: 401 }),
      };
    } catch (err) {
      return { error: err instanceof Error ? err.message : String(err) };
    }
  });

  protected readonly data = computed((): TrajectoryData | undefined => {
    const result = this.outcome().result;
    if (!result) return undefined;
    const { model } = this.content();
    const obs = this.observations()?.series;
    return {
      times: result.times,
      timeUnit: model.timeUnit,
      series: model.levels.map((level) => ({
        id: level.id,
        name: level.name,
        unit: level.unit,
        values: result.series[level.id] ?? [],
      })),
      ...(obs
        ? {
            observations: Object.entries(obs.levels).map(([id, values]) => ({
              id,
              times: obs.times,
              values,
            })),
          }
        : {}),
    };
  });
}
