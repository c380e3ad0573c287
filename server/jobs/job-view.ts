import { PROBLEM_BASE } from '../http/problem';
import type { JobRecord } from './jobs-repository';

/** A job as the API shows it (`GET /jobs/{id}`). */
export interface JobView {
  readonly id: string;
  readonly kind: string;
  readonly status: JobRecord['status'];
  readonly progress: number;
  readonly units: number;
  readonly createdAt: string;
  readonly startedAt?: string;
  readonly finishedAt?: string;
  readonly expiresAt: string;
  readonly result?: unknown;
  readonly error?: Record<string, unknown>;
  readonly links: { readonly self: string; readonly events: string };
}

/** The public view of a job record. */
export function jobView(job: JobRecord): JobView {
  const self = `/api/v1/jobs/${job.id}`;
  return {
    id: job.id,
    kind: job.kind,
    status: job.status,
    progress: job.progress,
    units: job.units,
    createdAt: job.createdAt,
    ...(job.startedAt ? { startedAt: job.startedAt } : {}),
    ...(job.finishedAt ? { finishedAt: job.finishedAt } : {}),
    expiresAt: job.expiresAt,
    ...(job.status === 'succeeded' ? { result: job.result } : {}),
    ...(job.error ? { error: job.error } : {}),
    links: { self, events: `${self}/events` },
  };
}

/** The problem a cancelled job ends with. */
export const CANCELLED_PROBLEM = {
  type: PROBLEM_BASE + 'cancelled',
  title: 'The job was cancelled',
  status: 409,
  detail: 'Cancelled at the client’s request (DELETE).',
};

/** The problem a job ends with when its process stopped. */
export const INTERRUPTED_PROBLEM = {
  type: PROBLEM_BASE + 'interrupted',
  title: 'The job was interrupted',
  status: 503,
  detail: 'The server running this job stopped; submit it again.',
};
