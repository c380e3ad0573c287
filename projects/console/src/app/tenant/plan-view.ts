import type { PlanOffer, TenantPlan } from './tenant-api';

/** How an offer compares with the current plan's monthly allowance. */
export type OfferChange = 'current' | 'larger' | 'smaller' | 'same-allowance';

/** One offer as the plan page shows it. */
export interface OfferCard {
  readonly offer: PlanOffer;
  readonly change: OfferChange;
  /** This month's units as a share of the offer's allowance, in percent rounded down. */
  readonly shareThisMonth: number;
  /** Why it cannot be chosen now; undefined when it can. */
  readonly blocked?: string;
}

/** One line of the before-and-after table of a plan change. */
export interface PlanChangeRow {
  readonly label: string;
  readonly now: number;
  readonly after: number;
}

/** What a plan change would do, for the confirmation. */
export interface PlanChangeSummary {
  readonly rows: readonly PlanChangeRow[];
  /** Consequences in plain sentences, most important first. */
  readonly effects: readonly string[];
}

const en = (n: number) => n.toLocaleString('en-US');

/** Share of `limit` that `used` is, rounded down; a zero allowance is full at once. */
export function sharePercent(used: number, limit: number): number {
  if (limit <= 0) return used > 0 ? 100 : 0;
  return Math.floor((used / limit) * 100);
}

/** The current plan's name as a heading: its offer's, or a plan the operator set. */
export function currentPlanName(plan: TenantPlan): string {
  return plan.current.offer?.name ?? 'Set by the platform operator';
}

/** The current plan in a sentence ("… is on the Survey plan now"). */
export function currentPlanPhrase(plan: TenantPlan): string {
  const offer = plan.current.offer;
  return offer ? `the ${offer.name} plan` : 'a plan the platform operator set';
}

/** The offers, each with how it compares and whether this month's units allow it. */
export function offerCards(plan: TenantPlan): OfferCard[] {
  const { used } = plan.usage;
  return plan.offers.map((offer) => {
    const change: OfferChange = offer.current
      ? 'current'
      : offer.monthlyUnits > plan.current.monthlyUnits
        ? 'larger'
        : offer.monthlyUnits < plan.current.monthlyUnits
          ? 'smaller'
          : 'same-allowance';
    return {
      offer,
      change,
      shareThisMonth: sharePercent(used, offer.monthlyUnits),
      blocked: offer.fitsThisMonth
        ? undefined
        : `This month’s ${en(used)} units already exceed its ${en(offer.monthlyUnits)}; it can ` +
          'be chosen once the count starts again.',
    };
  });
}

/** The before-and-after numbers and consequences of moving to `offer`. */
export function planChangeSummary(
  plan: TenantPlan,
  offer: PlanOffer,
  resetsOn: string,
): PlanChangeSummary {
  const now = plan.current;
  const used = plan.usage.used;
  const left = Math.max(0, offer.monthlyUnits - used);
  const effects = [
    'The change takes effect at once, for every key of the tenant and every signed-in member.',
    `The ${en(used)} units used this month carry over: ${sharePercent(used, offer.monthlyUnits)} ` +
      `% of the new allowance, leaving ${en(left)} until the count starts again on ${resetsOn}.`,
  ];
  if (offer.monthlyUnits < now.monthlyUnits) {
    effects.push(
      'Once those units are used, compute requests are refused until the count starts again; ' +
        'public pages embedding Tropline show an error meanwhile.',
    );
  }
  if (offer.perMinute < now.perMinute || offer.browserPerMinute < now.browserPerMinute) {
    effects.push('Keys may make fewer requests a minute; a busier key is asked to wait.');
  }
  return {
    rows: [
      { label: 'Compute units a month', now: now.monthlyUnits, after: offer.monthlyUnits },
      { label: 'Requests a minute, each server key', now: now.perMinute, after: offer.perMinute },
      {
        label: 'Requests a minute, each browser key',
        now: now.browserPerMinute,
        after: offer.browserPerMinute,
      },
    ],
    effects,
  };
}
