import { DatePipe, DecimalPipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  untracked,
} from '@angular/core';
import { MatButton } from '@angular/material/button';
import { MatIcon } from '@angular/material/icon';
import { MatProgressBar } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { PageData } from '../common/page-data';
import { Skeleton } from '../common/page-states';
import { ProblemAlert } from '../problem/problem-alert';
import { ConsoleSession } from '../session/console-session';
import { UsageApi } from './usage-api';
import { UsageBars } from './usage-bars';
import { daysOfMonth, endpointLabel, quotaStanding, usageBars } from './usage-view';

/** This month's compute units against the quota, where they went, the rate limits and alerts. */
@Component({
  selector: 'tc-usage-page',
  imports: [
    DatePipe,
    DecimalPipe,
    MatButton,
    MatIcon,
    MatProgressBar,
    MatTableModule,
    Skeleton,
    ProblemAlert,
    UsageBars,
  ],
  templateUrl: './usage-page.html',
  styleUrl: './usage-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UsagePage {
  private readonly api = inject(UsageApi);
  private readonly session = inject(ConsoleSession);

  protected readonly data = new PageData(() => this.api.month(), 'load usage');
  protected readonly standing = computed(() => {
    const u = this.data.value();
    return u ? quotaStanding(u) : undefined;
  });
  protected readonly days = computed(() => {
    const u = this.data.value();
    return u ? daysOfMonth(u, new Date().toISOString()) : [];
  });
  protected readonly keys = computed(() =>
    usageBars(
      (this.data.value()?.byKey ?? []).map((k) => ({
        // Member meters (`u-…`) already read as a person; keys also show their id.
        label: !k.name
          ? `Removed key ${k.keyId}`
          : k.keyId.startsWith('u-')
            ? k.name
            : `${k.name} (${k.keyId})`,
        units: k.units,
      })),
    ),
  );
  protected readonly endpoints = computed(() =>
    usageBars(
      (this.data.value()?.byEndpoint ?? []).map((e) => ({
        label: endpointLabel(e.endpoint),
        units: e.units,
      })),
    ),
  );
  protected readonly chargedDays = computed(() => this.days().filter((d) => d.units !== 0));
  protected readonly tableColumns = ['label', 'units'];

  constructor() {
    effect(() => {
      this.session.tenant();
      untracked(() => void this.data.load());
    });
  }
}
