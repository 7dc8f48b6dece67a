/**
 * Distances as people read them: miles or kilometres. No one's profile holds a
 * unit preference yet, so the unit follows the country of the place asked from:
 * miles where road signs give miles (the United States, the United Kingdom), else
 * kilometres.
 */

export const distanceUnits = ['mi', 'km'] as const;
export type DistanceUnit = (typeof distanceUnits)[number];

/** Metres in one unit. The international mile is exactly 1,609.344 m (by the 1959 agreement). */
export const METRES_PER: Record<DistanceUnit, number> = { mi: 1609.344, km: 1000 };

export const DISTANCE_UNIT_WORDS: Record<DistanceUnit, string> = { mi: 'miles', km: 'km' };

const MILE_COUNTRIES = new Set(['united states', 'united states of america', 'usa', 'us', 'u.s.', 'u.s.a.', 'united kingdom', 'uk', 'great britain', 'england', 'scotland', 'wales', 'northern ireland']);

/** The unit a person in this country reads distances in. */
export function distanceUnitFor(country: string | null | undefined): DistanceUnit {
  return country && MILE_COUNTRIES.has(country.trim().toLowerCase()) ? 'mi' : 'km';
}

/** "12 miles", "140 km": whole units past ten, one decimal below. */
export function formatDistance(distance: number, unit: DistanceUnit): string {
  const shown = distance < 10 ? distance.toFixed(1) : Math.round(distance).toLocaleString('en-US');
  return `${shown} ${DISTANCE_UNIT_WORDS[unit]}`;
}

/** Said where a place has no coordinates. */
export const POSTAL_CODE_NOT_FOUND = 'postal code not found: distances fall back to region';
