import { sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { shopRates, shops, users } from '../db/schema';
import { hashPassword } from '../lib/auth/passwords';
import { placeOf } from '../lib/postal-codes';

/**
 * The demo scenario: invented people and shops only. Every demo account uses
 * the same password so a visitor can try each role.
 */
export const DEMO_PASSWORD = 'tenthmark-demo';

/** The two demo shops' public profiles and rate cards (invented businesses, invented prices). */
const demoShops = {
  'bench@lanternhill.test': {
    profile: { name: 'Lantern Hill Machine Works', country: 'United States', region: 'Ohio', city: 'Dayton', postalCode: '45404', takesShipped: true, turnaroundDays: 8,
      receivingAddress: { lines: ['2215 Lantern Hill Road', 'Receiving door 3'], city: 'Dayton', region: 'Ohio', postalCode: '45404', country: 'United States' },
      capabilities: ['clean', 'crack-test', 'bore', 'hone', 'plateau-hone', 'torque-plate-hone', 'deck', 'line-hone'],
      equipmentNotes: 'Vertical boring bar, power hone with torque plates for common small-block V8s, deck surfacer, 0.0001 in dial bore gauges checked against a setting ring.' },
    rates: { clean: 9_500, 'crack-test': 6_000, bore: 3_500, hone: 2_500, 'plateau-hone': 1_500, 'torque-plate-hone': 3_000, deck: 18_000, 'line-hone': 32_500 },
  },
  'desk@kessrow.test': {
    profile: { name: 'Kessrow Bore & Deck', country: 'United States', region: 'Indiana', city: 'Muncie', postalCode: '47305', takesShipped: false, turnaroundDays: 5,
      capabilities: ['bore', 'hone', 'deck', 'sleeve', 'head-resurface', 'valve-job'],
      equipmentNotes: 'Boring and honing for iron blocks up to eight cylinders; sleeves fitted in house; head surfacing and valve work.' },
    rates: { bore: 3_200, hone: 2_800, deck: 16_500, sleeve: 21_000, 'head-resurface': 9_000, 'valve-job': 42_000 },
  },
  'floor@orrinvale.test': {
    profile: { name: 'Orrinvale Engine Machining', country: 'United States', region: 'Oregon', city: 'Bend', postalCode: '97701', takesShipped: true, turnaroundDays: 10,
      receivingAddress: { lines: ['88 Orrin Vale Court'], city: 'Bend', region: 'Oregon', postalCode: '97701', country: 'United States' },
      capabilities: ['clean', 'crack-test', 'bore', 'hone', 'plateau-hone', 'torque-plate-hone', 'deck', 'cam-bore', 'balance'],
      equipmentNotes: 'Climate-controlled inspection room at 20 °C; air gauging and dial bore gauges; profilometer for Ra and Rk on request.' },
    rates: { clean: 11_000, 'crack-test': 7_500, bore: 4_000, hone: 3_000, 'plateau-hone': 2_000, 'torque-plate-hone': 3_500, deck: 21_000, 'cam-bore': 38_000, balance: 29_000 },
  },
  'office@saltreed.test': {
    profile: { name: 'Saltreed Cylinder & Head', country: 'United States', region: 'Georgia', city: 'Savannah', postalCode: '31401', takesShipped: true, turnaroundDays: 9,
      receivingAddress: { lines: ['5 Saltreed Wharf Lane', 'Bay B'], city: 'Savannah', region: 'Georgia', postalCode: '31401', country: 'United States' },
      capabilities: ['clean', 'bore', 'hone', 'torque-plate-hone', 'deck', 'sleeve', 'head-resurface', 'valve-job'],
      equipmentNotes: 'Marine and industrial blocks a speciality; sleeving up to 5 in bores; head and deck surfacing.' },
    rates: { clean: 8_500, bore: 3_000, hone: 2_400, 'torque-plate-hone': 2_900, deck: 15_000, sleeve: 19_500, 'head-resurface': 8_500, 'valve-job': 39_000 },
  },
} as const;

export const demoAccounts = [
  { role: 'admin', email: 'admin@tenthmark.test', displayName: 'Perrin Oakhollow (Tenthmark staff)' },
  { role: 'builder', email: 'juno@builders.test', displayName: 'Juno Brackenridge' },
  { role: 'builder', email: 'teodor@builders.test', displayName: 'Teodor Halvecka' },
  { role: 'builder', email: 'mireille@builders.test', displayName: 'Mireille Ostrander' },
  { role: 'shop', email: 'bench@lanternhill.test', displayName: 'Lantern Hill Machine Works' },
  { role: 'shop', email: 'desk@kessrow.test', displayName: 'Kessrow Bore & Deck' },
  { role: 'shop', email: 'floor@orrinvale.test', displayName: 'Orrinvale Engine Machining' },
  { role: 'shop', email: 'office@saltreed.test', displayName: 'Saltreed Cylinder & Head' },
] as const;

/** Seeds the demo scenario when the database has no users; resolves to whether it seeded. */
export async function seedIfEmpty(db: Database): Promise<boolean> {
  const [{ count }] = await db.select({ count: sql<number>`count(*)::int` }).from(users);
  if (count > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const inserted = await tx.insert(users).values(
      demoAccounts.map((account) => ({
        email: account.email,
        displayName: account.displayName,
        role: account.role,
        passwordHash,
        emailVerifiedAt: new Date(),
      })),
    ).returning();
    for (const user of inserted) {
      const demo = demoShops[user.email as keyof typeof demoShops];
      if (!demo) continue;
      const address = 'receivingAddress' in demo.profile ? { ...demo.profile.receivingAddress, lines: [...demo.profile.receivingAddress.lines] } : null;
      const [shop] = await tx.insert(shops).values({ userId: user.id, ...demo.profile, ...(await placeOf(demo.profile.country, demo.profile.postalCode)), capabilities: [...demo.profile.capabilities], receivingAddress: address }).returning();
      await tx.insert(shopRates).values(Object.entries(demo.rates).map(([operation, priceCents]) => ({ shopId: shop.id, operation, priceCents })));
    }
  });
  return true;
}
