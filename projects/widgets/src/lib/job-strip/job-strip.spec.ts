import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { benchmarkSweep } from '@tropline/widgets/testing';
import { provideEchartsCore } from 'ngx-echarts';
import type { JobView, SweepResult } from '../api/analysis-types';
import { loadTroplineEcharts } from '../api/tropline-echarts';
import { defaultTroplineOptions, TROPLINE_OPTIONS } from '../api/tropline-options';
import { BifurcationChart } from '../bifurcation-chart/bifurcation-chart';
import type { JobState } from './job-state';
import { JobStrip } from './job-strip';

@Component({
  imports: [JobStrip],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<tropline-job-strip
    [state]="state()"
    label="Sweeping"
    (cancelJob)="asked = asked + 1"
  />`,
})
class StripHost {
  readonly state = signal<JobState<unknown>>({ kind: 'idle' });
  asked = 0;
}

async function settle(fixture: { whenStable(): Promise<unknown> }) {
  for (let i = 0; i < 4; i++) {
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
  }
}

describe('JobStrip', () => {
  function strip() {
    TestBed.configureTestingModule({ imports: [StripHost] });
    const fixture = TestBed.createComponent(StripHost);
    const el = fixture.nativeElement as HTMLElement;
    const host = () => el.querySelector('tropline-job-strip')!;
    return { fixture, el, host };
  }

  it('takes no space while idle or done', async () => {
    const { fixture, host } = strip();
    await settle(fixture);
    expect(host().classList).toContain('tropline-job-strip--quiet');
    fixture.componentInstance.state.set({ kind: 'done', result: {} });
    await settle(fixture);
    expect(host().classList).toContain('tropline-job-strip--quiet');
    expect(host().textContent!.trim()).toBe('');
  });

  it('shows the bar and a cancel button while running, and asks to cancel', async () => {
    const { fixture, host } = strip();
    fixture.componentInstance.state.set({ kind: 'running', progress: 0.47 });
    await settle(fixture);
    const bar = host().querySelector('mat-progress-bar')!;
    expect(bar.getAttribute('aria-label')).toBe('Sweeping');
    expect(bar.getAttribute('aria-valuenow')).toBe('47');
    // Announced in tenths so a screen reader is not flooded.
    expect(host().querySelector('[role="status"]')!.textContent).toContain('40% done');
    host().querySelector('button')!.click();
    expect(fixture.componentInstance.asked).toBe(1);
  });

  it('names the refusal, the fields at fault, and when a quota resets', async () => {
    const { fixture, host } = strip();
    fixture.componentInstance.state.set({
      kind: 'failed',
      error: {
        status: 429,
        title: 'Monthly compute units used up',
        message: 'The usage limit was reached. You can try again after 14:05.',
        fieldErrors: [{ pointer: '/steps', message: 'at most 400' }],
        retryAt: new Date('2031-03-04T14:05:00Z'),
        retryable: true,
      },
    });
    await settle(fixture);
    const alert = host().querySelector('[role="alert"]')!;
    expect(alert.querySelector('strong')!.textContent).toBe('Monthly compute units used up');
    expect(alert.textContent).toContain('You can try again after 14:05.');
    expect(alert.textContent).toContain('/steps: at most 400');
    expect(host().classList).not.toContain('tropline-job-strip--quiet');
  });

  it('says so once cancelled', async () => {
    const { fixture, host } = strip();
    fixture.componentInstance.state.set({ kind: 'cancelled' });
    await settle(fixture);
    expect(host().querySelector('[role="status"]')!.textContent).toContain(
      'The computation was cancelled.',
    );
  });
});

describe('JobStrip in a bifurcation chart on the real client', () => {
  const API = '/api/v1';
  const sweep = benchmarkSweep({ steps: 2 });

  const job = (status: JobView['status'], progress: number, result?: SweepResult) =>
    JSON.stringify({ id: 'j1', kind: 'sweeps', status, progress, ...(result ? { result } : {}) });

  @Component({
    imports: [BifurcationChart],
    changeDetection: ChangeDetectionStrategy.OnPush,
    template: `<tropline-bifurcation-chart [request]="request" />`,
  })
  class ChartHost {
    readonly request = sweep;
  }

  function setup() {
    TestBed.configureTestingModule({
      imports: [ChartHost],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideEchartsCore({ echarts: loadTroplineEcharts }),
        { provide: TROPLINE_OPTIONS, useValue: { ...defaultTroplineOptions(), renderer: 'svg' } },
      ],
    });
    const fixture = TestBed.createComponent(ChartHost);
    return {
      fixture,
      el: fixture.nativeElement as HTMLElement,
      http: TestBed.inject(HttpTestingController),
    };
  }

  it('moves the bar with each progress event, then draws the finished sweep', async () => {
    const { fixture, el, http } = setup();
    await settle(fixture);
    http.expectOne(`${API}/sweeps`).flush(JSON.parse(job('queued', 0)));
    const events = http.expectOne(`${API}/jobs/j1/events`);
    let text = `event: job\ndata: ${job('running', 0.5)}\n\n`;
    events.event({ type: HttpEventType.DownloadProgress, loaded: text.length, partialText: text });
    await settle(fixture);
    const bar = () => el.querySelector('mat-progress-bar');
    expect(bar()!.getAttribute('aria-valuenow')).toBe('50');
    expect(bar()!.getAttribute('aria-label')).toBe('Computing the bifurcation diagram');
    const result: SweepResult = {
      points: [
        { value: 0.4, maxima: [10], regime: 'equilibrium' },
        { value: 0.6, maxima: [9, 12], regime: 'cycle' },
      ],
    };
    text += `event: job\ndata: ${job('succeeded', 1, result)}\n\n`;
    events.flush(text);
    await settle(fixture);
    expect(bar()).toBeNull();
    expect(el.querySelector('figcaption')!.textContent).toMatch(/^Bifurcation diagram/);
    http.expectNone({ method: 'DELETE' });
    http.verify();
  });

  it('sends DELETE for the job when the reader presses cancel', async () => {
    const { fixture, el, http } = setup();
    await settle(fixture);
    http.expectOne(`${API}/sweeps`).flush(JSON.parse(job('running', 0.1)));
    const events = http.expectOne(`${API}/jobs/j1/events`);
    const cancel = Array.from(el.querySelectorAll('button')).find((b) =>
      b.textContent!.includes('Cancel'),
    )!;
    cancel.click();
    await settle(fixture);
    expect(events.cancelled).toBe(true);
    http
      .expectOne({ method: 'DELETE', url: `${API}/jobs/j1` })
      .flush(JSON.parse(job('failed', 0.1)));
    await settle(fixture);
    expect(el.querySelector('tropline-job-strip [role="status"]')!.textContent).toContain(
      'The computation was cancelled.',
    );
    http.verify();
  });
});
