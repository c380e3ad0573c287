import { HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { problemFromDocument, problemMessage } from './problem-message';

const now = new Date('2026-12-01T12:00:00Z');

function failure(status: number, error: unknown, headers: Record<string, string> = {}) {
  return new HttpErrorResponse({ status, error, headers: new HttpHeaders(headers) });
}

describe('problemMessage', () => {
  it('turns a 429 with Retry-After into a retry time', () => {
    const err = problemMessage(
      failure(
        429,
        { title: 'Monthly allowance used up', detail: 'The tenant used 1000 of 1000.' },
        {
          'Retry-After': '120',
        },
      ),
      now,
    );
    expect(err.title).toBe('Monthly allowance used up');
    expect(err.retryAt?.toISOString()).toBe('2026-12-01T12:02:00.000Z');
    expect(err.retryable).toBe(true);
    expect(err.message).toContain('The tenant used 1000 of 1000.');
  });

  it('keeps the field pointers of a validation problem', () => {
    const err = problemMessage(
      failure(400, {
        title: 'The request is not valid',
        detail: '/horizon: horizon must be greater than zero',
        errors: [{ pointer: '/horizon', message: 'horizon must be greater than zero' }],
      }),
      now,
    );
    expect(err.fieldErrors).toEqual([
      { pointer: '/horizon', message: 'horizon must be greater than zero' },
    ]);
    expect(err.retryable).toBe(false);
  });

  it('says what a site owner must do about a refused origin', () => {
    const err = problemMessage(failure(403, null), now);
    expect(err.message).toMatch(/allowed list/);
  });

  it('marks an unreachable service as retryable', () => {
    const err = problemMessage(failure(0, new ProgressEvent('error')), now);
    expect(err.status).toBe(0);
    expect(err.retryable).toBe(true);
  });
});

describe('problemFromDocument', () => {
  it('maps a failed job’s problem like an HTTP answer', () => {
    const err = problemFromDocument({
      status: 409,
      title: 'The job was cancelled',
      detail: 'Cancelled at the client’s request (DELETE).',
    });
    expect(err.status).toBe(409);
    expect(err.title).toBe('The job was cancelled');
    expect(err.message).toContain('Cancelled');
  });

  it('treats a job that failed without a document as a server failure', () => {
    expect(problemFromDocument(undefined).retryable).toBe(true);
  });
});

describe('retry time wording', () => {
  it('writes the reset time in the configured locale', () => {
    const err = problemMessage(failure(429, null, { 'Retry-After': '3600' }), now, 'de-DE');
    expect(err.message).toMatch(/You can try again after .*\d{2}:\d{2}\./);
  });
});
