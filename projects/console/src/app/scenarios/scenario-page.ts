import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { PageData } from '../common/page-data';
import { Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { ConsoleSession } from '../session/console-session';
import { CalibrationPanel } from './calibration-panel';
import { DatasetUploader } from './dataset-uploader';
import { EmbedSnippet } from './embed-snippet';
import { ProjectionPreview } from './projection-preview';
import { PublishPanel } from './publish-panel';
import { ScenarioAnalyses } from './scenario-analyses';
import { ScenariosApi } from './scenarios-api';
import type { Dataset, ScenarioSaved } from './scenario-types';

/** Loads what the page shows at once: the scenario, its latest version and its datasets. */
async function loadAll(api: ScenariosApi, id: string) {
  const [scenario, datasets] = await Promise.all([api.get(id), api.datasets(id)]);
  const latest = await api.version(id, scenario.latestVersion);
  return { scenario, latest, datasets };
}

/**
 * One scenario: its versions (each comparable with the one before), a preview of a version
 * with the widgets, the analyses of the previewed version for members who may run them, the
 * way to edit it into a new version, monitoring data, calibration, publication with public
 * ranges, retirement and the embed snippet.
 */
@Component({
  selector: 'tc-scenario-page',
  imports: [
    DatePipe,
    MatButton,
    MatIcon,
    MatTableModule,
    RouterLink,
    Skeleton,
    ProblemAlert,
    CalibrationPanel,
    DatasetUploader,
    EmbedSnippet,
    ProjectionPreview,
    PublishPanel,
    ScenarioAnalyses,
  ],
  templateUrl: './scenario-page.html',
  styleUrl: './scenario-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScenarioPage {
  private readonly api = inject(ScenariosApi);
  protected readonly session = inject(ConsoleSession);

  /** The scenario id, from the route. */
  readonly id = input.required<string>();

  protected readonly data = new PageData(() => loadAll(this.api, this.id()), 'load the scenario');
  protected readonly versionColumns = ['version', 'status', 'note', 'created', 'compare', 'show'];
  /** What the last action did; an edit page hands over its save through the navigation. */
  protected readonly announcement = signal(
    String(inject(Router).currentNavigation()?.extras.state?.['announce'] ?? ''),
  );
  /** The version previewed; the latest until another is chosen. */
  protected readonly previewed = new PageData(
    () => this.api.version(this.id(), this.previewNumber() ?? this.latestNumber()!),
    'load the version',
  );
  private readonly previewNumber = signal<number | undefined>(undefined);
  private readonly latestNumber = computed(() => this.data.value()?.scenario.latestVersion);
  protected readonly overlay = new PageData(() => {
    const last = this.data.value()?.datasets.at(-1);
    return last ? this.api.dataset(this.id(), last.version) : Promise.resolve(undefined);
  }, 'load the monitoring data');
  protected readonly levels = computed(
    () => this.data.value()?.latest.content?.model.levels.map((l) => l.id) ?? [],
  );

  constructor() {
    effect(() => {
      this.id();
      this.session.tenant();
      untracked(() => void this.reload());
    });
  }

  protected async reload(): Promise<void> {
    await this.data.load();
    if (!this.data.value()) return;
    await Promise.all([this.previewed.load(), this.overlay.load()]);
  }

  protected show(version: number): void {
    this.previewNumber.set(version);
    void this.previewed.load();
  }

  protected async uploaded(d: Dataset): Promise<void> {
    this.announcement.set(`Dataset version ${d.version} stored.`);
    await this.reload();
  }

  protected async savedFit(saved: ScenarioSaved): Promise<void> {
    this.announcement.set(`The fit is saved as version ${saved.version.version}.`);
    this.previewNumber.set(undefined);
    await this.reload();
  }

  protected async changed(message: string): Promise<void> {
    this.announcement.set(message);
    this.previewNumber.set(undefined);
    await this.reload();
  }
}
