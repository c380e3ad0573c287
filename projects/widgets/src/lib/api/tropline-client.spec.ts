import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { benchmarkSweep } from '@tropline/widgets/testing';
import type { JobView, SweepResult } from './analysis-types';
import type { TroplineApiError } from './problem-message';
import { TroplineClient } from './tropline-client';
import { defaultTroplineOptions, TROPLINE_OPTIONS } from './tropline-options';

// The wire format these tests speak is the server's own (server/jobs/jobs-routes.ts and
// job-view.ts): `POST /sweeps` answers the job; `GET /jobs/{id}/events` is a text/event-stream
// of `id: n`, `event: job`, `data: <job JSON>` blocks, the current job first and the finished
// job (with its result) last; `DELETE /jobs/{id}` cancels.

const API = 'https://tropline.example/api/v1';
const sweep = benchmarkSweep();
const result: SweepResult = {
  points: [
    { value: 0.4, maxima: [10.1], regime: 'equilibrium' },
    { value: 0.5, maxima: [9.2, 11.3], regime: 'cycle' },
    { value: 0.6, maxima: [8.7, 9.9, 12.4], regime: 'chaotic' },
  ],
};

function view(
  status: JobView['status'],
  progress: number,
  extra: Partial<JobView<SweepResult>> = {},
): JobView<SweepResult> {
  return { id: 'job-7', kind: 'sweeps', status, progress, ...extra };
}

/** One server-sent event block, as the server writes it. */
function sse(seq: number, job: JobView<SweepResult>): string {
  return `id: ${seq}\nevent: job\ndata: ${JSON.stringify(job)}\n\n`;
}

let backend: HttpTestingController | undefined;

function setup() {
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(),
      provideHttpClientTesting(),
      {
        provide: TROPLINE_OPTIONS,
        useValue: { ...defaultTroplineOptions(), apiUrl: API, apiKey: 'trb_test' },
      },
    ],
  });
  backend = TestBed.inject(HttpTestingController);
  return { client: TestBed.inject(TroplineClient), http: backend };
}

/** Follows the sweep, collecting every update, the error and whether it completed. */
function follow(client: TroplineClient) {
  const seen: JobView<SweepResult>[] = [];
  const out: { error?: TroplineApiError; complete: boolean } = { complete: false };
  const sub = client.sweep(sweep).subscribe({
    next: (j) => seen.push(j),
    error: (e: TroplineApiError) => (out.error = e),
    complete: () => (out.complete = true),
  });
  return { seen, out, sub };
}

describe('TroplineClient following a job', () => {
  afterEach(() => {
    // Every request a test caused was answered or expected: nothing left in flight.
    backend?.verify();
    backend = undefined;
    vi.useRealTimers();
  });

  it('submits once with a key and follows the event stream as it arrives, to the result', () => {
    const { client, http } = setup();
    const { seen, out } = follow(client);
    const post = http.expectOne({ method: 'POST', url: `${API}/sweeps` });
    expect(post.request.body).toEqual(sweep);
    expect(post.request.headers.get('Authorization')).toBe('Bearer trb_test');
    expect(post.request.headers.get('Idempotency-Key')).toMatch(/\S{8,}/);
    post.flush(view('queued', 0), { status: 202, statusText: 'Accepted' });

    const events = http.expectOne(`${API}/jobs/job-7/events`);
    expect(events.request.responseType).toBe('text');
    expect(events.request.reportProgress).toBe(true);
    // The stream arrives in pieces; an event cut in half waits for its other half.
    const body =
      sse(1, view('running', 0.25)) +
      ': keep-alive\n\n' +
      sse(2, view('running', 0.5)) +
      sse(3, view('succeeded', 1, { result }));
    const cut = body.indexOf('data:', body.indexOf('id: 2'));
    const progress = (partialText: string) =>
      events.event({
        type: HttpEventType.DownloadProgress,
        loaded: partialText.length,
        partialText,
      });
    progress(body.slice(0, cut));
    expect(seen.map((j) => j.progress)).toEqual([0.25]);
    progress(body.slice(0, cut + 20));
    expect(seen).toHaveLength(1);
    events.flush(body);

    expect(seen.map((j) => [j.status, j.progress])).toEqual([
      ['running', 0.25],
      ['running', 0.5],
      ['succeeded', 1],
    ]);
    expect(seen.at(-1)!.result).toEqual(result);
    expect(out).toEqual({ complete: true });
    // Nothing was cancelled: a finished job is not sent a DELETE when the subscriber leaves.
    http.expectNone({ method: 'DELETE' });
  });

  it('fetches the job when the finished update carries no result', () => {
    const { client, http } = setup();
    const { seen, out } = follow(client);
    http.expectOne(`${API}/sweeps`).flush(view('running', 0.1));
    http.expectOne(`${API}/jobs/job-7/events`).flush(sse(1, view('succeeded', 1)));
    const get = http.expectOne({ method: 'GET', url: `${API}/jobs/job-7` });
    get.flush(view('succeeded', 1, { result }));
    expect(seen.at(-1)!.result).toEqual(result);
    expect(out.complete).toBe(true);
  });

  it('cancels the job on the server when the subscriber leaves before it finishes', () => {
    const { client, http } = setup();
    const { seen, sub } = follow(client);
    http.expectOne(`${API}/sweeps`).flush(view('queued', 0));
    const events = http.expectOne(`${API}/jobs/job-7/events`);
    events.event({
      type: HttpEventType.DownloadProgress,
      loaded: 1,
      partialText: sse(1, view('running', 0.3)),
    });
    expect(seen.map((j) => j.progress)).toEqual([0.3]);
    sub.unsubscribe();
    expect(events.cancelled).toBe(true);
    const del = http.expectOne({ method: 'DELETE', url: `${API}/jobs/job-7` });
    expect(del.request.headers.get('Authorization')).toBe('Bearer trb_test');
    del.flush(view('failed', 0.3), { status: 202, statusText: 'Accepted' });
  });

  it('cancels a job left before its first update arrives', () => {
    const { client, http } = setup();
    const { seen, sub } = follow(client);
    http.expectOne(`${API}/sweeps`).flush(view('queued', 0));
    const events = http.expectOne(`${API}/jobs/job-7/events`);
    sub.unsubscribe();
    expect(seen).toEqual([]);
    expect(events.cancelled).toBe(true);
    http.expectOne({ method: 'DELETE', url: `${API}/jobs/job-7` }).flush(view('failed', 0));
  });

  it('opens the stream again when the server ends it before the job finishes', () => {
    vi.useFakeTimers();
    const { client, http } = setup();
    const { seen, out } = follow(client);
    http.expectOne(`${API}/sweeps`).flush(view('queued', 0));
    // The server closes a stream after its time limit (STREAM_MAX_MS) with the job unfinished.
    http.expectOne(`${API}/jobs/job-7/events`).flush(sse(1, view('running', 0.4)));
    vi.advanceTimersByTime(0);
    const again = http.expectOne(`${API}/jobs/job-7/events`);
    again.flush(sse(1, view('running', 0.4)) + sse(2, view('succeeded', 1, { result })));
    expect(seen.map((j) => j.status)).toEqual(['running', 'running', 'succeeded']);
    expect(out.complete).toBe(true);
  });

  it('polls the job every second when the stream cannot be reached, from where it stood', () => {
    vi.useFakeTimers();
    const { client, http } = setup();
    const { seen, out } = follow(client);
    http.expectOne(`${API}/sweeps`).flush(view('running', 0.2));
    // Status 0: the connection dropped (a proxy that refuses event streams, say).
    http
      .expectOne(`${API}/jobs/job-7/events`)
      .error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
    expect(seen).toEqual([]);
    http.expectNone(`${API}/jobs/job-7`);
    vi.advanceTimersByTime(1000);
    http.expectOne({ method: 'GET', url: `${API}/jobs/job-7` }).flush(view('running', 0.6));
    expect(seen.map((j) => j.progress)).toEqual([0.6]);
    vi.advanceTimersByTime(1000);
    http.expectOne(`${API}/jobs/job-7`).flush(view('succeeded', 1, { result }));
    expect(seen.map((j) => j.status)).toEqual(['running', 'succeeded']);
    expect(seen.at(-1)!.result).toEqual(result);
    expect(out.complete).toBe(true);
  });

  it('retries a 503 submission after a backoff with the same idempotency key', () => {
    vi.useFakeTimers();
    const { client, http } = setup();
    const { seen } = follow(client);
    const first = http.expectOne(`${API}/sweeps`);
    const key = first.request.headers.get('Idempotency-Key');
    first.flush(
      { type: 'about:blank', title: 'Busy', status: 503 },
      { status: 503, statusText: 'Service Unavailable' },
    );
    http.expectNone(`${API}/sweeps`);
    vi.advanceTimersByTime(500); // BASE_DELAY_MS, the first backoff
    const second = http.expectOne(`${API}/sweeps`);
    expect(second.request.headers.get('Idempotency-Key')).toBe(key);
    second.flush(view('succeeded', 1, { result }));
    expect(seen.map((j) => j.status)).toEqual(['succeeded']);
  });

  it('ends with the problem of a failed job, mapped to words a reader can act on', () => {
    const { client, http } = setup();
    const { out } = follow(client);
    http.expectOne(`${API}/sweeps`).flush(view('queued', 0));
    http.expectOne(`${API}/jobs/job-7/events`).flush(
      sse(
        1,
        view('failed', 0.5, {
          error: {
            status: 422,
            title: 'The sweep could not be computed',
            detail: 'Integration failed at /levels/1/handlingTime = 0.55.',
          },
        }),
      ),
    );
    expect(out.error).toMatchObject({
      status: 422,
      title: 'The sweep could not be computed',
      message: 'Integration failed at /levels/1/handlingTime = 0.55.',
      retryable: false,
    });
    http.expectNone({ method: 'DELETE' });
  });

  it('refuses a quota-exhausted submission with the reset time, without retrying', () => {
    const { client, http } = setup();
    const { out } = follow(client);
    http.expectOne(`${API}/sweeps`).flush(
      {
        title: 'Monthly compute units used up',
        status: 429,
        detail: 'This request costs 9 units and 2 of the tenant’s 500 monthly units are left.',
      },
      { status: 429, statusText: 'Too Many Requests', headers: { 'Retry-After': '120' } },
    );
    http.expectNone(`${API}/sweeps`);
    expect(out.error?.status).toBe(429);
    expect(out.error?.retryAt).toBeInstanceOf(Date);
    expect(out.error?.message).toMatch(/2 of the tenant’s 500 monthly units .* try again after/);
  });
});
