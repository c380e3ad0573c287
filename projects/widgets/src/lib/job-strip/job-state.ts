import { type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { catchError, map, Observable, of, startWith, switchMap, takeUntil } from 'rxjs';
import type { JobView } from '../api/analysis-types';
import type { TroplineApiError } from '../api/problem-message';

/** Where a widget's background job stands. */
export type JobState<T> =
  | { readonly kind: 'idle' }
  | { readonly kind: 'running'; readonly progress?: number }
  | { readonly kind: 'done'; readonly result: T }
  | { readonly kind: 'failed'; readonly error: TroplineApiError }
  | { readonly kind: 'cancelled' };

/**
 * Follows the job for the newest request: a newer request or `cancel` unsubscribes from the
 * running one, which makes the client cancel it on the server. Call in an injection context.
 */
export function jobState<R, T>(
  request: Signal<R | undefined>,
  run: (request: R) => Observable<JobView<T>>,
  cancel: Observable<void>,
): Signal<JobState<T>> {
  return toSignal(
    toObservable(request).pipe(
      switchMap((req) => {
        if (req === undefined) return of<JobState<T>>({ kind: 'idle' });
        const job = run(req).pipe(
          map((view): JobState<T> =>
            view.status === 'succeeded' && view.result !== undefined
              ? { kind: 'done', result: view.result }
              : { kind: 'running', progress: view.status === 'queued' ? undefined : view.progress },
          ),
          catchError((error: TroplineApiError) => of<JobState<T>>({ kind: 'failed', error })),
          startWith<JobState<T>>({ kind: 'running' }),
          takeUntil(cancel),
        );
        return new Observable<JobState<T>>((subscriber) => {
          let finished = false;
          const sub = job.subscribe({
            next: (s) => {
              if (s.kind === 'done' || s.kind === 'failed') finished = true;
              subscriber.next(s);
            },
            complete: () => {
              if (!finished) subscriber.next({ kind: 'cancelled' });
            },
          });
          return () => sub.unsubscribe();
        });
      }),
    ),
    { initialValue: { kind: 'idle' } as JobState<T> },
  );
}
