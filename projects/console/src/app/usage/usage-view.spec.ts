import { daysOfMonth, describeBars, endpointLabel, quotaStanding, usageBars } from './usage-view';

describe('usage view', () => {
  it('draws bars relative to the largest, and none for an empty month', () => {
    expect(
      usageBars([
        { label: 'a', units: 50 },
        { label: 'b', units: 200 },
      ]),
    ).toEqual([
      { label: 'a', units: 50, length: 25 },
      { label: 'b', units: 200, length: 100 },
    ]);
    expect(usageBars([{ label: 'a', units: 0 }])).toEqual([{ label: 'a', units: 0, length: 0 }]);
    expect(usageBars([{ label: 'refund', units: -2 }])[0]!.length).toBe(0);
  });

  it('ranks the month against the limit', () => {
    expect(quotaStanding({ used: 10, limit: 100 })).toEqual({
      percent: 10,
      remaining: 90,
      level: 'ok',
    });
    expect(quotaStanding({ used: 80, limit: 100 }).level).toBe('warning');
    expect(quotaStanding({ used: 100, limit: 100 })).toEqual({
      percent: 100,
      remaining: 0,
      level: 'exhausted',
    });
    expect(quotaStanding({ used: 0, limit: 0 }).level).toBe('exhausted');
  });

  it('fills the days of the month up to today with zeros', () => {
    const days = daysOfMonth(
      { period: '2026-12', byDay: [{ day: '2026-12-02', units: 4 }] },
      '2026-12-03T10:00:00Z',
    );
    expect(days.map((d) => [d.label, d.units])).toEqual([
      ['2026-12-01', 0],
      ['2026-12-02', 4],
      ['2026-12-03', 0],
    ]);
    expect(daysOfMonth({ period: '2026-11', byDay: [] }, '2026-12-03').length).toBe(30);
  });

  it('describes a chart in one sentence', () => {
    const bars = usageBars([
      { label: 'Portal', units: 30 },
      { label: 'Server', units: 1200 },
    ]);
    expect(describeBars('per key', bars)).toBe('1,230 units per key; the most, 1,200, for Server.');
    expect(describeBars('per key', [])).toBe('No units charged per key yet this month.');
    expect(endpointLabel('projections')).toBe('Projections');
    expect(endpointLabel('something-new')).toBe('something-new');
  });
});
