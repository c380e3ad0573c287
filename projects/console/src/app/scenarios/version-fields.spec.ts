import { diffDocuments, UPLAND_DEMO, withParameter } from '@tropline/core';
import type { ScenarioContent } from './scenario-types';
import { authorName, fieldLabel, fieldRows, shownValue } from './version-fields';

const v1: ScenarioContent = {
  name: 'Hobcairn Moor',
  model: UPLAND_DEMO.model,
  initial: UPLAND_DEMO.initial,
  horizon: 100,
  publicParameters: [{ pointer: '/levels/1/mortality', min: 0.2, max: 0.5 }],
};
const v2: ScenarioContent = {
  ...v1,
  description: 'After the 2026 count',
  model: withParameter(UPLAND_DEMO.model, '/levels/1/mortality', 0.35),
  horizon: 60,
};

describe('version fields', () => {
  // The change list is the server's own (`diffDocuments`, what GET …/comparison answers).
  const rows = fieldRows(v1, v2, diffDocuments(v1, v2));
  const byPointer = new Map(rows.map((r) => [r.pointer, r]));

  it('lists every field of both versions, marking exactly the ones that differ', () => {
    const differing = rows.filter((r) => r.difference !== 'same').map((r) => r.pointer);
    expect(differing.sort()).toEqual(['/description', '/horizon', '/model/levels/1/mortality']);
    expect(byPointer.get('/description')).toMatchObject({ before: '—', difference: 'added' });
    expect(byPointer.get('/horizon')).toMatchObject({ before: '100', after: '60' });
    expect(byPointer.get('/model/levels/0/growthRate')?.difference).toBe('same');
    expect(rows.length).toBe(new Set(rows.map((r) => r.pointer)).size);
  });

  it('names fields in words and says which parameter a public range is for', () => {
    expect(fieldLabel('/initial/deer', v1.model)).toBe('Start: Red deer (Cervus elaphus)');
    expect(fieldLabel('/model/levels/2/name', v1.model)).toBe('Level 3 name');
    expect(fieldLabel('/model/levels/1/mortality', v1.model)).toMatch(/^Red deer .*: Mortality/);
    expect(byPointer.get('/publicParameters/0/pointer')?.after).toMatch(/^Red deer .*Mortality/);
    expect(fieldLabel('/somewhere/else', v1.model)).toBe('/somewhere/else');
  });

  it('writes values for reading and authors by name', () => {
    expect(shownValue(0.123456789)).toBe('0.123457');
    expect(shownValue(undefined)).toBe('—');
    const names = new Map([['u1', 'Priya Calder']]);
    expect(authorName('user:u1', names)).toBe('Priya Calder');
    expect(authorName('user:gone', names)).toBe('a former member');
    expect(authorName('key:abc', names)).toBe('API key abc');
  });
});
