import { navFor } from '../shell/console-nav';
import {
  currentPlanName,
  currentPlanPhrase,
  offerCards,
  planChangeSummary,
  sharePercent,
} from './plan-view';
import type { PlanOffer, TenantPlan } from './tenant-api';

// Invented offers in the shape the API answers (openapi.yaml, TenantPlan).
const offer = (id: string, monthlyUnits: number, extra: Partial<PlanOffer> = {}): PlanOffer => ({
  id,
  name: id[0]!.toUpperCase() + id.slice(1),
  description: '',
  monthlyUnits,
  perMinute: monthlyUnits / 100,
  browserPerMinute: monthlyUnits / 1000,
  current: false,
  fitsThisMonth: true,
  ...extra,
});

function planOf(used: number): TenantPlan {
  return {
    current: {
      offer: { id: 'survey', name: 'Survey' },
      monthlyUnits: 100_000,
      perMinute: 1000,
      browserPerMinute: 100,
      since: '2026-12-01T08:00:00.000Z',
    },
    usage: { period: '2026-12', used, resetsAt: '2027-01-01T00:00:00.000Z' },
    offers: [
      offer('pond', 20_000, { fitsThisMonth: used <= 20_000 }),
      offer('survey', 100_000, { current: true }),
      offer('lake', 100_000),
      offer('catchment', 1_000_000),
    ],
  };
}

describe('offerCards', () => {
  it('compares each offer with the current allowance and blocks one below the month’s use', () => {
    const cards = offerCards(planOf(30_000));
    expect(cards.map((c) => c.change)).toEqual(['smaller', 'current', 'same-allowance', 'larger']);
    expect(cards.map((c) => c.shareThisMonth)).toEqual([150, 30, 30, 3]);
    expect(cards[0]!.blocked).toBe(
      'This month’s 30,000 units already exceed its 20,000; it can be chosen once the count ' +
        'starts again.',
    );
    expect(cards.slice(1).every((c) => c.blocked === undefined)).toBe(true);
  });
});

describe('sharePercent', () => {
  it('rounds down and treats a zero allowance as full once anything is used', () => {
    expect(sharePercent(79_999, 100_000)).toBe(79);
    expect(sharePercent(0, 0)).toBe(0);
    expect(sharePercent(1, 0)).toBe(100);
  });
});

describe('planChangeSummary', () => {
  it('says a smaller plan keeps the month’s units and refuses requests past them', () => {
    const plan = planOf(15_000);
    const s = planChangeSummary(plan, plan.offers[0]!, '1 January 2027, 00:00 UTC');
    expect(s.rows).toEqual([
      { label: 'Compute units a month', now: 100_000, after: 20_000 },
      { label: 'Requests a minute, each server key', now: 1000, after: 200 },
      { label: 'Requests a minute, each browser key', now: 100, after: 20 },
    ]);
    expect(s.effects[1]).toBe(
      'The 15,000 units used this month carry over: 75 % of the new allowance, leaving 5,000 ' +
        'until the count starts again on 1 January 2027, 00:00 UTC.',
    );
    expect(s.effects).toHaveLength(4);
    expect(s.effects[2]).toMatch(/^Once those units are used, compute requests are refused/);
  });

  it('names no refusal for a larger plan', () => {
    const plan = planOf(15_000);
    const s = planChangeSummary(plan, plan.offers[3]!, '1 January 2027, 00:00 UTC');
    expect(s.effects).toHaveLength(2);
    expect(s.effects[1]).toContain('1 % of the new allowance, leaving 985,000');
  });
});

describe('the current plan in words', () => {
  it('names the offer, or says the operator set the numbers', () => {
    const plan = planOf(0);
    expect(currentPlanName(plan)).toBe('Survey');
    expect(currentPlanPhrase(plan)).toBe('the Survey plan');
    const custom = { ...plan, current: { ...plan.current, offer: null } };
    expect(currentPlanName(custom)).toBe('Set by the platform operator');
    expect(currentPlanPhrase(custom)).toBe('a plan the platform operator set');
  });
});

describe('the tenant page in the navigation', () => {
  it('is offered to owners only, as the role matrix gives tenant:manage to owners only', () => {
    expect(navFor('owner', false).map((i) => i.path)).toContain('/tenant');
    for (const role of ['admin', 'analyst', 'viewer', undefined] as const) {
      expect(navFor(role, true).map((i) => i.path)).not.toContain('/tenant');
    }
  });
});
