import { eq } from 'drizzle-orm';
import type { BidInput } from '../shared/schemas/bids';
import type { InspectionInput } from '../shared/schemas/inspection';
import type { JobInput } from '../shared/schemas/jobs';
import type { ShopProfileInput } from '../shared/schemas/shops';
import { insertJob } from '../server/modules/jobs/jobs.repository';
import { upsertShop } from '../server/modules/shops/shops.repository';
import { randomBytes } from 'node:crypto';
import type { Database } from '../server/db/client';
import { jobs, shops, users, type User } from '../server/db/schema';
import { hashPassword } from '../server/lib/auth/passwords';

export const TEST_PASSWORD = 'correct horse battery';

let passwordHash: Promise<string> | undefined;

/** A unique e-mail address, so tests never collide on each other's rows. */
export const uniqueEmail = (label = 'person') => `${label}-${randomBytes(5).toString('hex')}@example.test`;

export async function createUser(
  db: Database,
  overrides: Partial<typeof users.$inferInsert> & { password?: string } = {},
): Promise<User & { password: string }> {
  const { password = TEST_PASSWORD, ...rest } = overrides;
  const hash = password === TEST_PASSWORD ? await (passwordHash ??= hashPassword(TEST_PASSWORD)) : await hashPassword(password);
  const [user] = await db
    .insert(users)
    .values({
      email: uniqueEmail(rest.role ?? 'builder'),
      displayName: 'Test Person',
      role: 'builder',
      passwordHash: hash,
      emailVerifiedAt: new Date(),
      ...rest,
    })
    .returning();
  return { ...user, password };
}


/** A date `days` from today, as YYYY-MM-DD. */
export const inDays = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

export function shopProfileInput(overrides: Partial<ShopProfileInput> = {}): ShopProfileInput {
  return {
    name: `Test Bore Works ${randomBytes(3).toString('hex')}`,
    country: 'United States',
    region: 'Ohio',
    city: 'Dayton',
    takesShipped: true,
    capabilities: ['clean', 'bore', 'hone', 'deck'],
    equipmentNotes: 'Boring bar, power hone, deck surfacer.',
    turnaroundDays: 10,
    rateCard: [
      { operation: 'bore', priceCents: 3500 },
      { operation: 'hone', priceCents: 2500 },
      { operation: 'deck', priceCents: 18000 },
    ],
    notifyMatchingJobs: false,
    receivingAddress: { lines: ['1180 Foundry Row', 'Dock 2'], city: 'Dayton', region: 'Ohio', postalCode: '45402', country: 'United States' },
    ...overrides,
  };
}

/**
 * A shop account with its profile. Its payout account is marked ready unless
 * `payouts: false` (the payment tests set one up through the stand-in instead).
 */
export async function createShop(
  db: Database,
  overrides: Partial<ShopProfileInput> = {},
  userOverrides: Partial<typeof users.$inferInsert> = {},
  options: { payouts?: boolean } = {},
) {
  const user = await createUser(db, { role: 'shop', ...userOverrides });
  let shop = await db.transaction((tx) => upsertShop(tx, user.id, shopProfileInput(overrides)));
  if (options.payouts ?? true) {
    [shop] = await db
      .update(shops)
      .set({ payoutAccountId: `acct_factory_${randomBytes(6).toString('hex')}`, payoutsReadyAt: new Date() })
      .where(eq(shops.id, shop.id))
      .returning();
  }
  return { user, shop };
}

export function jobInput(overrides: Partial<JobInput> = {}): JobInput {
  return {
    title: 'Bore and hone a V8 block',
    engineFamily: 'Small-block V8, iron block',
    layout: 'v',
    cylinders: 8,
    blockMaterial: 'cast-iron',
    unit: 'in',
    stockBore: 4,
    stroke: 3.48,
    pistonDiameter: 4.028,
    clearanceMin: 0.0025,
    clearanceMax: 0.0035,
    pistonType: 'forged',
    crosshatchMinDeg: 40,
    crosshatchMaxDeg: 50,
    maxTaper: 0.0005,
    maxOutOfRound: 0.0005,
    deckNotes: '',
    operations: [
      { code: 'bore', quantity: 8 },
      { code: 'hone', quantity: 8 },
    ],
    logistics: 'ship',
    country: 'United States',
    region: 'Ohio',
    city: 'Columbus',
    neededBy: inDays(30),
    notes: '',
    ...overrides,
  };
}

/** A job straight into the database, in the given state. */
export async function createJob(db: Database, builderId: string, options: { status?: 'draft' | 'open'; input?: Partial<JobInput> } = {}) {
  const job = await insertJob(db, builderId, jobInput(options.input));
  if ((options.status ?? 'open') === 'open') {
    const [open] = await db.update(jobs).set({ status: 'open', publishedAt: new Date() }).where(eq(jobs.id, job.id)).returning();
    return open;
  }
  return job;
}

export function bidInput(overrides: Partial<BidInput> = {}): BidInput {
  return {
    lineItems: [
      { operation: 'bore', description: 'Bore', quantity: 8, unitPriceCents: 3500 },
      { operation: 'hone', description: 'Hone', quantity: 8, unitPriceCents: 2500 },
    ],
    turnaroundDays: 8,
    validUntil: inDays(14),
    note: '',
    ...overrides,
  };
}


/**
 * An 8-cylinder inspection record honed to 4.0310 in with small, invented variations (demo numbers),
 * read at `temperatureC`; `badTaperOn` gives that cylinder 0.0009 in of taper.
 */
export function inspectionRecordInput(overrides: Partial<InspectionInput> = {}, badTaperOn?: number, temperatureC = 21): InspectionInput {
  const cylinders = Array.from({ length: 8 }, (_, i) => {
    const base = 4.031 + (i % 3) * 0.0001;
    return {
      top: { thrust: base + 0.0001, axial: base + 0.0001 },
      middle: { thrust: base, axial: base + 0.0001 },
      bottom: { thrust: i === badTaperOn ? base - 0.0009 : base, axial: base },
      piston: 4.028,
    };
  });
  return {
    conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC, torquePlate: true },
    cylinders,
    deck: { readings: [0.001, 0.0015, 0.001, 0.002], raUm: 0.9 },
    finish: { mode: 'values', raUm: 0.45, rkUm: 0.6, rpkUm: 0.15, rvkUm: 1.2 },
    crosshatch: { mode: 'measured', includedAngleDeg: 45 },
    signedOffBy: 'Ada Quernfield',
    notes: '',
    ...overrides,
  };
}

/** Eight cylinders honed alike to 4.0310 in with 4.0280 in pistons (demo numbers), within the factory job's limits. */
export function uniformRecordInput(): InspectionInput {
  return {
    conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureC: 21, torquePlate: true },
    cylinders: Array.from({ length: 8 }, () => ({
      top: { thrust: 4.0311, axial: 4.0311 },
      middle: { thrust: 4.031, axial: 4.0311 },
      bottom: { thrust: 4.031, axial: 4.031 },
      piston: 4.028,
    })),
    deck: { readings: [0.001, 0.0015, 0.001, 0.002], raUm: 0.9 },
    finish: { mode: 'values', raUm: 0.45, rkUm: 0.6, rpkUm: 0.15, rvkUm: 1.2 },
    crosshatch: { mode: 'measured', includedAngleDeg: 45 },
    signedOffBy: 'Ada Quernfield',
    notes: '',
  };
}
