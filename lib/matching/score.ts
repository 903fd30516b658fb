// Scoring one shop against one request: pure, so the ranking can be checked without a database.
import type { Capabilities } from '@/lib/market/schema';
import { MATCH_SETTINGS, MATCH_WEIGHTS } from './settings';
import type { WheelNeeds } from './needs';

export interface MatchCandidate {
  capabilities: Capabilities;
  distanceMiles: number;
  /** Wilson lower bound of positive reviews (0 to 1), with the figures behind it for the reasons. */
  rating: { score: number; average: number | null; count: number };
  openJobs: number;
  buildsAtOnce: number;
}

export interface MatchParts {
  capability: number;
  distance: number;
  rating: number;
  backlog: number;
}

export interface MatchScore {
  /** Weighted sum of the parts, 0 to 1. */
  score: number;
  parts: MatchParts;
  /** Plain reasons, in the order the parts are weighed. */
  reasons: string[];
}

const list = (values: number[]) => [...new Set(values)].join(' and ');

/** The shop's lists as plain numbers (the schema narrows them to the standard sizes). */
interface Lists {
  rimWidthsIn: readonly number[];
  diametersIn: readonly number[];
  gauges: readonly number[];
  spokeCounts: readonly number[];
  hubDrilling: boolean;
}

/** Hard requirements: every wheel's rim width class and diameter are on the shop's lists. */
export function meetsHardNeeds(needs: WheelNeeds[], caps: Lists): boolean {
  return needs.every((n) => caps.rimWidthsIn.includes(n.rimWidthIn) && caps.diametersIn.includes(n.diameterIn));
}

/** Share of the wheel checks the shop's lists meet; a list left empty earns partial credit. */
function capabilityPart(needs: WheelNeeds[], caps: Lists, reasons: string[]): number {
  const checks: number[] = [];
  const listed = (values: readonly number[], value: number) => (values.length === 0 ? MATCH_SETTINGS.unlistedCredit : values.includes(value) ? 1 : 0);
  for (const n of needs) {
    checks.push(caps.rimWidthsIn.includes(n.rimWidthIn) ? 1 : 0, caps.diametersIn.includes(n.diameterIn) ? 1 : 0);
    checks.push(listed(caps.gauges, n.gauge), listed(caps.spokeCounts, n.spokes));
    if (n.needsDrilling) checks.push(caps.hubDrilling ? 1 : 0);
  }
  reasons.push(`builds ${list(needs.map((n) => n.rimWidthIn))} inch rims and ${list(needs.map((n) => n.diameterIn))} inch wheels`);
  const gauges = needs.map((n) => n.gauge);
  if (caps.gauges.length === 0) reasons.push('has not listed spoke gauges');
  else if (gauges.every((g) => caps.gauges.includes(g))) reasons.push(`lists ${list(gauges)} gauge spokes`);
  else reasons.push(`does not list ${list(gauges.filter((g) => !caps.gauges.includes(g)))} gauge spokes`);
  const counts = needs.map((n) => n.spokes);
  if (caps.spokeCounts.length === 0) reasons.push('has not listed spoke counts');
  else if (counts.every((c) => caps.spokeCounts.includes(c))) reasons.push(`lists ${list(counts)}-spoke wheels`);
  else reasons.push(`does not list ${list(counts.filter((c) => !caps.spokeCounts.includes(c)))}-spoke wheels`);
  if (needs.some((n) => n.needsDrilling)) reasons.push(caps.hubDrilling ? 'drills hub flanges, which this build needs' : 'does not drill hub flanges, which this build needs');
  return checks.reduce((a, b) => a + b, 0) / checks.length;
}

export function distancePart(miles: number): number {
  return 1 / (1 + Math.max(0, miles) / MATCH_SETTINGS.distanceHalfScoreMiles);
}

export function backlogPart(openJobs: number, buildsAtOnce: number): number {
  return Math.min(1, Math.max(0, 1 - openJobs / Math.max(1, buildsAtOnce)));
}

export function scoreCandidate(needs: WheelNeeds[], c: MatchCandidate): MatchScore {
  const reasons: string[] = [];
  const capability = capabilityPart(needs, c.capabilities, reasons);
  const distance = distancePart(c.distanceMiles);
  reasons.push(`${Math.round(c.distanceMiles)} miles away`);
  const rating = Math.min(1, Math.max(0, c.rating.score));
  reasons.push(c.rating.count === 0 || c.rating.average === null ? 'no reviews yet' : `rated ${c.rating.average.toFixed(1)} of 5 from ${c.rating.count} ${c.rating.count === 1 ? 'review' : 'reviews'}`);
  const backlog = backlogPart(c.openJobs, c.buildsAtOnce);
  const free = Math.max(0, c.buildsAtOnce - c.openJobs);
  reasons.push(free === 0 ? `fully booked (${c.openJobs} open ${c.openJobs === 1 ? 'job' : 'jobs'})` : `${free} of ${c.buildsAtOnce} build ${c.buildsAtOnce === 1 ? 'slot' : 'slots'} free`);
  const parts = { capability, distance, rating, backlog };
  const score =
    MATCH_WEIGHTS.capability * capability + MATCH_WEIGHTS.distance * distance + MATCH_WEIGHTS.rating * rating + MATCH_WEIGHTS.backlog * backlog;
  return { score, parts, reasons };
}
