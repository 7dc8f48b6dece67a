import { Router } from 'express';
import { uuidSchema } from '../../../shared/schemas/common';
import { shopDirectoryQuerySchema, shopProfileSchema } from '../../../shared/schemas/shops';
import type { Database } from '../../db/client';
import { currentUser, requireRole } from '../../lib/auth/guards';
import { notFound } from '../../lib/errors';
import { shopRatings } from '../reviews/ratings';
import { findListedShopById, findShopByUser, ratesFor, searchShops, toPublicShop, upsertShop, type ShopRow } from './shops.repository';

/** What a shop sees of itself: the public profile, its e-mail choice and its payout account's state. */
function ownShop(shop: ShopRow, rateCard: Array<{ operation: string; priceCents: number }>) {
  const payouts = shop.payoutsReadyAt ? 'ready' : shop.payoutAccountId ? 'pending' : 'none';
  return { ...toPublicShop(shop, rateCard), notifyMatchingJobs: shop.notifyMatchingJobs, payouts };
}

/** The public shop directory and a shop's own profile. */
export function shopsRouter(deps: { db: Database }) {
  const { db } = deps;
  const router = Router();

  router.get('/shops', async (req, res) => {
    res.json(await searchShops(db, shopDirectoryQuerySchema.parse(req.query)));
  });

  router.get('/shops/:shopId', async (req, res) => {
    const shop = await findListedShopById(db, uuidSchema.parse(req.params.shopId));
    if (!shop) throw notFound('No shop with that id.');
    const [rates, ratings] = await Promise.all([ratesFor(db, [shop.id]), shopRatings(db, [shop.id])]);
    res.json({ shop: toPublicShop(shop, rates.get(shop.id) ?? [], ratings.get(shop.id) ?? null) });
  });

  router.get('/shop-profile', requireRole('shop'), async (req, res) => {
    const shop = await findShopByUser(db, currentUser(req).id);
    if (!shop) throw notFound('You have not set up your shop profile yet.');
    const rates = await ratesFor(db, [shop.id]);
    res.json({ shop: ownShop(shop, rates.get(shop.id) ?? []) });
  });

  router.put('/shop-profile', requireRole('shop'), async (req, res) => {
    const input = shopProfileSchema.parse(req.body);
    const shop = await db.transaction((tx) => upsertShop(tx, currentUser(req).id, input));
    const rates = await ratesFor(db, [shop.id]);
    res.json({ shop: ownShop(shop, rates.get(shop.id) ?? []) });
  });

  return router;
}
