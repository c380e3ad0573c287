import type { ConsoleUsage } from './usage-api';

/** One bar of a usage chart: its label, value and length relative to the largest. */
export interface UsageBar {
  readonly label: string;
  readonly units: number;
  /** 0–100: share of the largest bar, for the drawn length only. */
  readonly length: number;
}

/** How the month stands against the limit. */
export interface QuotaStanding {
  /** 0–100, rounded down (100 once the limit is reached). */
  readonly percent: number;
  readonly remaining: number;
  /** `ok` below 80 %, `warning` from 80 %, `exhausted` at the limit. */
  readonly level: 'ok' | 'warning' | 'exhausted';
}

/** Endpoint names of the ledger as a reader knows them. */
const ENDPOINT_LABELS: Readonly<Record<string, string>> = {
  projections: 'Projections',
  equilibria: 'Equilibria',
  regimes: 'Long-run regimes',
  sweeps: 'Parameter sweeps',
  'regime-maps': 'Regime maps',
  ensembles: 'Ensembles',
  comparisons: 'Scenario comparisons',
  calibrations: 'Calibrations',
  usage: 'Usage checks',
  keys: 'Key management',
  jobs: 'Job status',
};

/** An endpoint's name on screen; unknown ones show as they are. */
export function endpointLabel(endpoint: string): string {
  return ENDPOINT_LABELS[endpoint] ?? endpoint;
}

/** Bars for rows of `{ label, units }`, lengths relative to the largest (never negative). */
export function usageBars(rows: readonly { label: string; units: number }[]): UsageBar[] {
  const top = Math.max(0, ...rows.map((r) => r.units));
  return rows.map((r) => ({
    label: r.label,
    units: r.units,
    length: top > 0 ? Math.max(0, Math.round((r.units / top) * 1000) / 10) : 0,
  }));
}

/** The month's units against the limit. */
export function quotaStanding(u: Pick<ConsoleUsage, 'used' | 'limit'>): QuotaStanding {
  const percent = u.limit > 0 ? Math.min(100, Math.floor((u.used / u.limit) * 100)) : 100;
  const remaining = Math.max(0, u.limit - u.used);
  const level = u.used >= u.limit ? 'exhausted' : percent >= 80 ? 'warning' : 'ok';
  return { percent, remaining, level };
}

/** Every day of the month up to `today` (inclusive), with 0 where nothing was charged. */
export function daysOfMonth(u: Pick<ConsoleUsage, 'period' | 'byDay'>, today: string): UsageBar[] {
  const charged = new Map(u.byDay.map((d) => [d.day, d.units]));
  const [y, m] = u.period.split('-').map(Number) as [number, number];
  const daysIn = new Date(Date.UTC(y, m, 0)).getUTCDate();
  const last = today.startsWith(u.period) ? Number(today.slice(8, 10)) : daysIn;
  const rows = Array.from({ length: last }, (_, i) => {
    const day = `${u.period}-${String(i + 1).padStart(2, '0')}`;
    return { label: day, units: charged.get(day) ?? 0 };
  });
  return usageBars(rows);
}

/** A sentence that says what a chart shows, for its caption and for screen readers. */
export function describeBars(what: string, bars: readonly UsageBar[]): string {
  const charged = bars.filter((b) => b.units > 0);
  if (charged.length === 0) return `No units charged ${what} yet this month.`;
  const top = charged.reduce((a, b) => (b.units > a.units ? b : a));
  const total = charged.reduce((s, b) => s + b.units, 0);
  return `${total.toLocaleString('en')} units ${what}; the most, ${top.units.toLocaleString('en')}, for ${top.label}.`;
}
