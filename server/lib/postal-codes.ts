/**
 * Coordinates of a postal code, from a dataset shipped inside a package: no
 * online geocoding, nothing leaves the machine.
 *
 * The dataset is the `zipcodes` package (BSD licence, Dav Glass; the most used
 * postal-code package of its kind, about 44,000 codes): every United States ZIP
 * code with its centroid, and Canada by forward sortation area (the first three
 * characters of a postal code, K1A of "K1A 0B1"), so a Canadian place is known to
 * a few kilometres. Codes of other countries are not found, and distances to them
 * fall back to region.
 *
 * The package is about 5 MB of JavaScript that takes over half a second to load,
 * so it is loaded on the first look-up, not when the server starts.
 */

export type Coordinates = { latitude: number; longitude: number };

type Dataset = { lookup(code: string): { latitude: number; longitude: number; country: string } | undefined };
let dataset: Promise<Dataset> | undefined;
const load = () => (dataset ??= import('zipcodes').then((m) => (m.default ?? m) as Dataset));

const COUNTRY_CODES: Record<string, 'US' | 'CA'> = {
  'united states': 'US',
  'united states of america': 'US',
  usa: 'US',
  us: 'US',
  'u.s.': 'US',
  'u.s.a.': 'US',
  canada: 'CA',
  ca: 'CA',
};

/** The key the dataset files a code under, or undefined when the code cannot be one of that country's. */
function datasetKey(country: 'US' | 'CA', postalCode: string): string | undefined {
  const code = postalCode.trim().toUpperCase();
  if (country === 'US') return /^\d{5}(-?\d{4})?$/.test(code) ? code.slice(0, 5) : undefined;
  return /^[A-Z]\d[A-Z] ?\d[A-Z]\d$|^[A-Z]\d[A-Z]$/.test(code) ? code.slice(0, 3) : undefined;
}

/** Where a postal code of this country is, or null when it is not given, malformed, of another country or not in the dataset. */
export async function locatePostalCode(country: string, postalCode: string | null | undefined): Promise<Coordinates | null> {
  if (!postalCode) return null;
  const countryCode = COUNTRY_CODES[country.trim().toLowerCase()];
  if (!countryCode) return null;
  const key = datasetKey(countryCode, postalCode);
  if (!key) return null;
  const found = (await load()).lookup(key);
  if (!found || found.country !== (countryCode === 'US' ? 'US' : 'Canada')) return null;
  return { latitude: found.latitude, longitude: found.longitude };
}

/** The place columns of a shop or job row (server/db/schema/columns.ts placeColumns) for what was entered. */
export async function placeOf(country: string, postalCode: string | null | undefined) {
  const at = await locatePostalCode(country, postalCode);
  return { postalCode: postalCode?.trim() || null, latitude: at?.latitude ?? null, longitude: at?.longitude ?? null };
}

/**
 * A postal code given alone (the board's and directory's `near`): five digits are a
 * United States ZIP code, letter-digit-letter a Canadian one. With the unit of that country.
 */
export async function locateAnyPostalCode(postalCode: string): Promise<(Coordinates & { unit: 'mi' | 'km' }) | null> {
  const country = /^\d/.test(postalCode.trim()) ? 'US' : 'CA';
  const at = await locatePostalCode(country, postalCode);
  return at && { ...at, unit: country === 'US' ? 'mi' : 'km' };
}
