import { HttpErrorResponse } from '@angular/common/http';
import { csvReport } from './csv-report';
import { embedSnippets, KEY_PLACEHOLDER } from './embed-snippets';

describe('csvReport', () => {
  it('lists the bad cells in file order and ignores other failures', () => {
    const err = new HttpErrorResponse({
      status: 400,
      error: {
        errors: [
          { pointer: '/file', line: 4, column: 2, field: 'deer', message: 'not a number: "x"' },
          { pointer: '/file', line: 2, column: 3, message: 'values must be ≥ 0' },
          { pointer: '/changeNote', message: 'too long' },
        ],
      },
    });
    expect(csvReport(err)).toEqual([
      { line: 2, column: 3, message: 'values must be ≥ 0' },
      { line: 4, column: 2, field: 'deer', message: 'not a number: "x"' },
    ]);
    expect(csvReport(new HttpErrorResponse({ status: 413, error: {} }))).toEqual([]);
    expect(csvReport(new Error('network'))).toEqual([]);
  });
});

describe('embedSnippets', () => {
  it('names the API, the scenario and a key placeholder in both forms', () => {
    const s = embedSnippets('https://tropline.example', 'larchmere-moor');
    expect(s.element).toContain('<tropline-projection');
    expect(s.element).toContain('api-url="https://tropline.example/api/v1"');
    expect(s.element).toContain('scenario="larchmere-moor"');
    expect(s.element).toContain(`api-key="${KEY_PLACEHOLDER}"`);
    expect(s.angular).toContain('<tropline-projection-panel');
    expect(s.angular).toContain('/published-scenarios/larchmere-moor');
  });
});
