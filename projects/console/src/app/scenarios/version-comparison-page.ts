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
import { MatCheckbox } from '@angular/material/checkbox';
import { MatFormField, MatLabel } from '@angular/material/form-field';
import { MatInput } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { PageData } from '../common/page-data';
import { EmptyState, Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { ConsoleSession } from '../session/console-session';
import { ScenariosApi } from './scenarios-api';
import { authorName, fieldRows } from './version-fields';
import { versionChanges, versionComparisonRequest } from './analysis-requests';
import { ScenarioComparison, type ComparisonRequest } from '@tropline/widgets';
import { MembersApi } from '../members/members-api';

/** A version number from the query, or undefined. */
function versionParam(raw: string | undefined): number | undefined {
  const n = Number(raw);
  return Number.isSafeInteger(n) && n >= 1 ? n : undefined;
}

async function loadComparison(
  api: ScenariosApi,
  people: MembersApi,
  id: string,
  from?: number,
  to?: number,
) {
  const [scenario, members] = await Promise.all([api.get(id), people.members().catch(() => [])]);
  const last = scenario.latestVersion;
  const b = to ?? last;
  const a = from ?? Math.max(1, b - 1);
  const [before, after, comparison] = await Promise.all([
    api.version(id, a),
    api.version(id, b),
    api.compare(id, a, b),
  ]);
  const names = new Map(members.map((m) => [m.userId, m.name]));
  return { scenario, before, after, comparison, names };
}

/**
 * Two versions of a scenario side by side, field by field: every field in words with its value
 * in each version, the differences marked in the table (not by colour alone) and countable,
 * as `GET /scenarios/{id}/comparison` reports them.
 */
@Component({
  selector: 'tc-version-comparison-page',
  imports: [
    DatePipe,
    RouterLink,
    MatButton,
    MatCheckbox,
    MatFormField,
    MatInput,
    MatLabel,
    EmptyState,
    ProblemAlert,
    ScenarioComparison,
    Skeleton,
  ],
  templateUrl: './version-comparison-page.html',
  styleUrl: './version-comparison-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VersionComparisonPage {
  private readonly api = inject(ScenariosApi);
  private readonly members = inject(MembersApi);
  private readonly router = inject(Router);
  protected readonly session = inject(ConsoleSession);

  /** The scenario id, from the route. */
  readonly id = input.required<string>();
  /** The earlier version, from `?from=`. */
  readonly from = input<string | undefined>(undefined);
  /** The later version, from `?to=`. */
  readonly to = input<string | undefined>(undefined);

  protected readonly data = new PageData(
    () =>
      loadComparison(
        this.api,
        this.members,
        this.id(),
        versionParam(this.from()),
        versionParam(this.to()),
      ),
    'compare the versions',
  );
  protected readonly onlyDifferences = signal(false);
  /** The projections of both versions compared, once asked (it is charged). */
  protected readonly projections = signal<ComparisonRequest | undefined>(undefined);
  /** How many numbers differ that a projection comparison can vary. */
  protected readonly numeric = computed(
    () => versionChanges(this.data.value()?.comparison.changes ?? []).length,
  );
  protected readonly rows = computed(() => {
    const d = this.data.value();
    if (!d?.before.content || !d.after.content) return [];
    return fieldRows(d.before.content, d.after.content, d.comparison.changes);
  });
  protected readonly differing = computed(() => this.rows().filter((r) => r.difference !== 'same'));
  protected readonly shown = computed(() =>
    this.onlyDifferences() ? this.differing() : this.rows(),
  );
  protected readonly author = authorName;
  protected readonly DIFFERENCE = {
    same: '',
    changed: 'Changed',
    added: 'Added',
    removed: 'Removed',
  } as const;

  constructor() {
    effect(() => {
      this.id();
      this.from();
      this.to();
      this.session.tenant();
      untracked(() => {
        this.projections.set(undefined);
        void this.data.load();
      });
    });
  }

  /** Compares the projections: the earlier version against the later one's values. */
  protected compareProjections(): void {
    const d = this.data.value();
    if (!d?.before.content) return;
    this.projections.set(
      versionComparisonRequest(d.before.content, d.after.version, d.comparison.changes),
    );
  }

  /** Shows another pair of versions (the address changes, so it can be shared). */
  protected choose(which: 'from' | 'to', event: Event): void {
    const d = this.data.value();
    if (!d) return;
    const value = Number((event.target as HTMLSelectElement).value);
    const pair = { from: d.comparison.from, to: d.comparison.to, [which]: value };
    void this.router.navigate(['/scenarios', this.id(), 'compare'], { queryParams: pair });
  }
}
