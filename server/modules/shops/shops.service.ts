import { distanceUnitFor, POSTAL_CODE_NOT_FOUND } from '../../../shared/distance';
import type { ShopDirectoryQuery } from '../../../shared/schemas/shops';
import type { Executor } from '../../db/client';
import { placeAt } from '../../db/earth';
import type { User } from '../../db/schema';
import { badRequest } from '../../lib/errors';
import { locateAnyPostalCode } from '../../lib/postal-codes';
import { builderPlace } from '../jobs/jobs.repository';
import { searchShops, type DirectoryOrigin } from './shops.repository';

/**
 * Where the directory measures from: the postal code typed in (`near`); else, for a signed-in builder, their
 * latest job whose postal code gave a place, or, when none did, their latest job's region; else nothing.
 * A builder has no postal code of their own on Tenthmark, and their jobs already hold where they work.
 */
async function directoryOrigin(db: Executor, user: User | undefined, query: ShopDirectoryQuery): Promise<DirectoryOrigin | null> {
  if (query.near !== undefined) {
    const at = await locateAnyPostalCode(query.near);
    if (!at) throw badRequest(`That postal code was not found (${POSTAL_CODE_NOT_FOUND}).`, { near: 'Postal code not found.' });
    return { unit: query.unit ?? at.unit, postalCode: query.near, from: 'near', at, region: null };
  }
  if (user?.role !== 'builder') return null;
  const { placed, latest } = await builderPlace(db, user.id);
  const job = placed ?? latest;
  if (!job) return null;
  return {
    unit: query.unit ?? distanceUnitFor(job.country),
    postalCode: job.postalCode,
    from: 'latest-job',
    at: placeAt(job),
    region: { country: job.country, region: job.region },
  };
}

/** The directory as this person sees it (anyone may look; a builder's own place orders it for them). */
export async function shopDirectory(db: Executor, user: User | undefined, query: ShopDirectoryQuery) {
  return searchShops(db, query, await directoryOrigin(db, user, query));
}
