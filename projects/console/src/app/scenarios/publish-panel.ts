import { DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatCheckbox } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatProgressBar } from '@angular/material/progress-bar';
import { firstValueFrom } from 'rxjs';
import { ConfirmDialog, type ConfirmData } from '../common/confirm-dialog';
import { ProblemAlert } from '../problem/problem-alert';
import { problemText, type ProblemText } from '../problem/problem-text';
import { defaultRange, sameRanges, tunableParameters, withPublicRanges } from './scenario-drafts';
import { ScenariosApi } from './scenarios-api';
import type { PublicParameter, Scenario, ScenarioVersion } from './scenario-types';

/** One row of the public-ranges form. */
interface RangeRow {
  readonly pointer: string;
  readonly label: string;
  readonly value: number;
  readonly on: boolean;
  readonly min: number;
  readonly max: number;
}

/**
 * Publishes the latest version with the ranges the public may move each parameter in (saving
 * a version first when the ranges changed, since versions never change), and retires the
 * published version after a confirmation.
 */
@Component({
  selector: 'tc-publish-panel',
  imports: [DecimalPipe, MatButton, MatCheckbox, MatProgressBar, ProblemAlert],
  templateUrl: './publish-panel.html',
  styleUrl: './publish-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PublishPanel {
  private readonly api = inject(ScenariosApi);
  private readonly dialog = inject(MatDialog);

  /** The scenario. */
  readonly scenario = input.required<Scenario>();
  /** Its latest version, with content. */
  readonly latest = input.required<ScenarioVersion>();
  /** Emits after a publication or retirement, with what to announce. */
  readonly changed = output<string>();

  protected readonly rows = signal<RangeRow[]>([]);
  protected readonly busy = signal(false);
  protected readonly problem = signal<ProblemText | undefined>(undefined);
  protected readonly ranges = computed((): PublicParameter[] =>
    this.rows()
      .filter((r) => r.on)
      .map((r) => ({ pointer: r.pointer, min: r.min, max: r.max, label: r.label })),
  );
  protected readonly invalid = computed(() =>
    this.rows().some((r) => r.on && !(r.min <= r.value && r.value <= r.max && r.min < r.max)),
  );

  constructor() {
    effect(() => {
      const content = this.latest().content;
      if (!content) return;
      const current = new Map((content.publicParameters ?? []).map((p) => [p.pointer, p]));
      this.rows.set(
        tunableParameters(content.model).map((t) => {
          const p = current.get(t.pointer);
          return {
            ...t,
            on: !!p,
            ...(p ? { min: p.min, max: p.max } : defaultRange(t)),
            label: p?.label ?? t.label,
          };
        }),
      );
    });
  }

  protected set(pointer: string, change: Partial<RangeRow>): void {
    this.rows.update((rows) => rows.map((r) => (r.pointer === pointer ? { ...r, ...change } : r)));
  }

  protected num(event: Event): number {
    return Number((event.target as HTMLInputElement).value);
  }

  protected async publish(): Promise<void> {
    const latest = this.latest();
    const content = latest.content;
    if (!content || this.invalid()) return;
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      let version = latest.version;
      if (!sameRanges(content.publicParameters, this.ranges()) || latest.status !== 'draft') {
        const saved = await this.api.save(
          this.scenario().id,
          withPublicRanges(content, this.ranges(), latest.version),
        );
        version = saved.version.version;
      }
      const published = await this.api.publish(this.scenario().id, version);
      this.changed.emit(`Version ${version} is published as ${published.publicId}.`);
    } catch (err) {
      this.problem.set(problemText(err, 'publish'));
    } finally {
      this.busy.set(false);
    }
  }

  protected async retire(): Promise<void> {
    const s = this.scenario();
    if (!s.publishedVersion) return;
    const ref = this.dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, {
      data: {
        title: `Retire version ${s.publishedVersion}?`,
        message:
          `Pages that embed ${s.publicId} stop showing the scenario at once. The public id stays ` +
          'reserved: publishing a version later brings the pages back.',
        confirm: 'Retire',
      },
    });
    if (!(await firstValueFrom(ref.afterClosed()))) return;
    this.busy.set(true);
    this.problem.set(undefined);
    try {
      await this.api.retire(s.id, s.publishedVersion);
      this.changed.emit(`Version ${s.publishedVersion} is retired.`);
    } catch (err) {
      this.problem.set(problemText(err, 'retire the version'));
    } finally {
      this.busy.set(false);
    }
  }
}
