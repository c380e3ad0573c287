import type { Request, Response } from 'express';
import type { KeyPrincipal } from '../auth/key-principal';
import type { JobView } from './job-view';
import type { JobsService } from './jobs-service';

/** Longest a progress stream stays open; a client reconnects for more. */
export const STREAM_MAX_MS = 10 * 60_000;

const FINISHED = new Set<JobView['status']>(['succeeded', 'failed']);

/** Whether a job has finished (succeeded or failed, cancellation included). */
export const isFinished = (job: JobView) => FINISHED.has(job.status);

/**
 * Streams a job's changes as Server-Sent Events: one `job` event (data: the job's JSON) at once
 * and on every change, the last when it finishes; a comment every 15 s keeps proxies from
 * closing the stream, which ends after `STREAM_MAX_MS` at the latest. Jobs run by another
 * process reach the stream through the database, read once a second. `first` is the job as
 * the caller's route found it (a missing or foreign one answered 404 before the stream began).
 */
export function streamJobEvents(
  jobs: JobsService,
  principal: KeyPrincipal,
  first: JobView,
  req: Request,
  res: Response,
): void {
  const id = first.id;
  let last = first;
  res.status(200).set({
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-store',
    'X-Accel-Buffering': 'no',
  });
  res.flushHeaders();
  let seq = 0;
  const send = (job: JobView) => {
    last = job;
    res.write(`id: ${++seq}\nevent: job\ndata: ${JSON.stringify(job)}\n\n`);
    if (isFinished(job)) stop();
  };
  const poll = setInterval(() => {
    jobs.refresh(principal, id).then((job) => {
      if (job && (job.status !== last.status || job.progress !== last.progress)) send(job);
    }, stop);
  }, 1000);
  const keepAlive = setInterval(() => res.write(': keep-alive\n\n'), 15_000);
  const limit = setTimeout(() => stop(), STREAM_MAX_MS);
  const unsubscribe = jobs.subscribe(id, send);
  let stopped = false;
  function stop() {
    if (stopped) return;
    stopped = true;
    clearInterval(poll);
    clearInterval(keepAlive);
    clearTimeout(limit);
    unsubscribe();
    res.end();
  }
  req.on('close', stop);
  send(last);
}
