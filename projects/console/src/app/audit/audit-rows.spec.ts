import type { Member } from '../members/member-rows';
import { auditQuery, auditRows, describeRef } from './audit-rows';

const PRIYA: Member = {
  userId: 'u1',
  email: 'priya@larchmere.example',
  name: 'Priya Calder',
  role: 'analyst',
  since: '2026-01-01T00:00:00Z',
};

describe('describeRef', () => {
  const people = new Map([['u1', PRIYA]]);
  it('names members, and says what other references are', () => {
    expect(describeRef('user:u1', people)).toBe('Priya Calder');
    expect(describeRef('user:0123456789', people)).toBe('Former member 01234567');
    expect(describeRef('key:abcdefghijk', people)).toBe('API key abcdefgh');
    expect(describeRef('email:new@larchmere.example', people)).toBe('new@larchmere.example');
    expect(describeRef('cli', people)).toBe('Command line');
    expect(describeRef(undefined, people)).toBe('');
  });
});

describe('auditRows', () => {
  it('puts actions in words and flattens the detail', () => {
    const [row] = auditRows(
      [
        {
          id: 7,
          actor: 'user:u1',
          action: 'member.role-change',
          target: 'user:u1',
          detail: { from: 'viewer', to: 'analyst' },
          at: '2026-06-01T10:00:00Z',
          address: '127.0.0.1',
        },
      ],
      [PRIYA],
    );
    expect(row).toMatchObject({
      who: 'Priya Calder',
      what: 'Changed a role',
      detail: 'from: viewer; to: analyst',
      address: '127.0.0.1',
    });
    expect(auditRows([{ id: 1, actor: 'cli', action: 'x.new', at: '' }], [])[0]?.what).toBe(
      'x.new',
    );
  });
});

describe('auditQuery', () => {
  it('sends only what is set, with `to` covering its whole day', () => {
    expect(
      auditQuery(
        { action: 'key.issue', actor: '', target: ' ', from: '2026-06-01', to: '2026-06-02' },
        41,
        25,
      ),
    ).toEqual({
      limit: '25',
      action: 'key.issue',
      from: '2026-06-01T00:00:00.000Z',
      to: '2026-06-02T23:59:59.999Z',
      before: '41',
    });
  });
});
