import { HttpErrorResponse } from '@angular/common/http';
import { fieldMessage, problemText } from './problem-text';

describe('problemText', () => {
  it('takes the title, detail and field errors of a problem and adds what to do next', () => {
    const err = new HttpErrorResponse({
      status: 400,
      error: {
        title: 'The request is not valid',
        detail: '1 problem',
        errors: [{ pointer: '/origins/0', message: '"x" is not an origin' }, { nope: 1 }],
      },
    });
    const p = problemText(err, 'issue the key');
    expect(p).toMatchObject({
      status: 400,
      title: 'The request is not valid',
      detail: '1 problem',
    });
    expect(p.fields).toEqual([{ pointer: '/origins/0', message: '"x" is not an origin' }]);
    expect(p.next).toBe('Correct the marked fields and try again.');
    expect(fieldMessage(p, '/origins')).toBe('"x" is not an origin');
    expect(fieldMessage(p, '/name')).toBeUndefined();
  });

  it('explains an unreachable API and a server fault without a problem body', () => {
    const down = problemText(new HttpErrorResponse({ status: 0 }), 'load the keys');
    expect(down.title).toBe('Could not load the keys');
    expect(down.detail).toBe('The console could not reach the API.');
    expect(down.next).toContain('Check your network connection');
    const fault = problemText(new HttpErrorResponse({ status: 503, error: 'busy' }), 'x');
    expect(fault.next).toContain('fault on the server');
  });

  it('reads a thrown error that is not HTTP', () => {
    expect(problemText(new Error('boom'), 'save').detail).toBe('boom');
  });
});
