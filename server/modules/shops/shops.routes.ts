import { uuidSchema } from '../../../shared/schemas/common';
import { ownShopAnswerSchema, shopAnswerSchema, shopDirectoryPageSchema, shopDirectoryQuerySchema, shopProfileSchema, type OwnShop } from '../../../shared/schemas/shops';
import { z } from 'zod';
import type { Database } from '../../db/client';
import { routesFor } from '../../lib/http/routes';
import { notFound } from '../../lib/errors';
import { shopRatings } from '../reviews/ratings';
import { shopStanding } from '../standing/standing.repository';
import { findListedShopById, findShopByUser, ratesFor, toPublicShop, upsertShop, type ShopRow } from './shops.repository';
import { shopDirectory } from './shops.service';

/** What a shop sees of itself: the public profile (with its standing), its e-mail choice and its payout account's state. */
async function ownShop(db: Database, shop: ShopRow): Promise<OwnShop> {
  const [rates, standing] = await Promise.all([ratesFor(db, [shop.id]), shopStanding(db, shop.id)]);
  const payouts = shop.payoutsReadyAt ? 'ready' : shop.payoutAccountId ? 'pending' : 'none';
  return { ...toPublicShop(shop, rates.get(shop.id) ?? [], null, standing), postalCode: shop.postalCode, placeFound: shop.latitude !== null, notifyMatchingJobs: shop.notifyMatchingJobs, receivingAddress: shop.receivingAddress ?? null, payouts };
}

const route = routesFor<{ db: Database }>('Shops');

/** The public shop directory and a shop's own profile. */
export const shopsRoutes = [
  route({
    method: 'get',
    path: '/api/shops',
    summary: 'The public shop directory',
    access: 'public',
    query: shopDirectoryQuerySchema,
    reply: { json: shopDirectoryPageSchema },
    handler: ({ deps, user, query }) => shopDirectory(deps.db, user, query),
  }),
  route({
    method: 'get',
    path: '/api/shops/:shopId',
    summary: 'A shop’s public page',
    access: 'public',
    params: z.object({ shopId: uuidSchema }),
    reply: { json: shopAnswerSchema },
    handler: async ({ deps: { db }, params }) => {
      const shop = await findListedShopById(db, params.shopId);
      if (!shop) throw notFound('No shop with that id.');
      const [rates, ratings, standing] = await Promise.all([ratesFor(db, [shop.id]), shopRatings(db, [shop.id]), shopStanding(db, shop.id)]);
      return { shop: toPublicShop(shop, rates.get(shop.id) ?? [], ratings.get(shop.id) ?? null, standing) };
    },
  }),
  route({
    method: 'get',
    path: '/api/shop-profile',
    summary: 'The signed-in shop’s own profile',
    access: 'shop',
    reply: { json: ownShopAnswerSchema },
    handler: async ({ deps: { db }, user }) => {
      const shop = await findShopByUser(db, user.id);
      if (!shop) throw notFound('You have not set up your shop profile yet.');
      return { shop: await ownShop(db, shop) };
    },
  }),
  route({
    method: 'put',
    path: '/api/shop-profile',
    summary: 'Create or replace the signed-in shop’s profile and rate card',
    access: 'shop',
    body: shopProfileSchema,
    reply: { json: ownShopAnswerSchema },
    handler: async ({ deps: { db }, user, body }) => {
      const shop = await db.transaction((tx) => upsertShop(tx, user.id, body));
      return { shop: await ownShop(db, shop) };
    },
  }),
];
