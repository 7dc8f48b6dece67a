import { sql } from 'drizzle-orm';
import sharp from 'sharp';
import { prefillBidLines } from '../../shared/catalogue';
import { acceptAsRead } from '../../shared/calc/conformance';
import { EXPANSION_COEFFICIENTS, PISTON_MATERIAL } from '../../shared/calc/thermal';
import type { InspectionInput, InspectionView } from '../../shared/schemas/inspection';
import type { JobInput } from '../../shared/schemas/jobs';
import type { Database } from '../db/client';
import { HttpSession } from './http-session';
import { submitHostedPage } from './payments-stand-in/page-client';
import { DEMO_PASSWORD } from './seed';

/**
 * The demo scenario's jobs, built through the app's own HTTP API against a
 * running app and the payment stand-in, so every payment, payout, record and
 * review in it went through the same code a person's would. Invented people,
 * shops, engines and readings only.
 */

const DAY = 24 * 60 * 60_000;
const isoDay = (offsetDays: number) => new Date(Date.now() + offsetDays * DAY).toISOString().slice(0, 10);

// ---------------------------------------------------------------------------
// Invented photos and readings

/** A little pseudo-random generator with a seed, so the demo is the same every time. */
function randomFrom(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A drawn photo of a block's deck (bores, bolt holes, water jackets) or of a honed bore wall (crosshatch), as a JPEG. */
async function drawnPhoto(kind: 'deck' | 'bore', cylinders: number, hue: number): Promise<Buffer> {
  const width = 1200;
  const height = 800;
  let shapes = '';
  if (kind === 'deck') {
    const perBank = cylinders > 6 ? cylinders / 2 : cylinders;
    const banks = cylinders > 6 ? 2 : 1;
    const r = Math.min(70, 900 / perBank / 2.4);
    for (let bank = 0; bank < banks; bank++) {
      const y = banks === 1 ? 400 : 250 + bank * 300;
      shapes += `<rect x="120" y="${y - r * 1.6}" width="960" height="${r * 3.2}" rx="24" fill="hsl(${hue},8%,62%)" stroke="hsl(${hue},10%,35%)" stroke-width="4"/>`;
      for (let i = 0; i < perBank; i++) {
        const x = 180 + r + i * ((840 - 2 * r) / Math.max(1, perBank - 1));
        shapes += `<circle cx="${x}" cy="${y}" r="${r}" fill="hsl(${hue},6%,28%)" stroke="hsl(${hue},12%,80%)" stroke-width="6"/>`;
        shapes += `<circle cx="${x - r * 0.95}" cy="${y - r * 1.2}" r="9" fill="#222"/><circle cx="${x + r * 0.95}" cy="${y + r * 1.2}" r="9" fill="#222"/>`;
      }
    }
  } else {
    for (let i = -20; i < 40; i++) {
      shapes += `<line x1="${i * 40}" y1="0" x2="${i * 40 + 400}" y2="800" stroke="hsl(${hue},10%,${45 + (i % 3) * 6}%)" stroke-width="3"/>`;
      shapes += `<line x1="${i * 40 + 400}" y1="0" x2="${i * 40}" y2="800" stroke="hsl(${hue},10%,${48 + (i % 4) * 5}%)" stroke-width="3"/>`;
    }
  }
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><rect width="100%" height="100%" fill="hsl(${hue},14%,${kind === 'deck' ? 88 : 70}%)"/>${shapes}</svg>`;
  return sharp(Buffer.from(svg)).jpeg({ quality: 82 }).toBuffer();
}

/**
 * Finished-bore readings around `bore` with small taper and out-of-round,
 * rounded to the gauge's resolution (invented, plausible for a good hone job).
 * `badTaper` widens one cylinder's top so it fails a taper limit.
 */
function readingsFor(
  spec: { cylinders: number; bore: number; piston: number; step: number; boreGrowth: number; pistonGrowth: number },
  seed: number,
  badTaper?: number,
): InspectionInput['cylinders'] {
  const rand = randomFrom(seed);
  // Sizes are planned at 20 °C and read warm: each reading is the 20 °C size grown by its material's expansion.
  const round = (v: number) => Math.round((v * spec.boreGrowth) / spec.step) * spec.step;
  const fix = (v: number) => Number(round(v).toFixed(spec.step < 0.001 ? 4 : 3));
  return Array.from({ length: spec.cylinders }, (_, i) => {
    const base = spec.bore + (Math.floor(rand() * 3) - 1) * spec.step;
    const flare = Math.floor(rand() * 3) * spec.step; // bell-mouth at the top
    const oval = Math.floor(rand() * 2) * spec.step; // thrust wears a touch larger
    const top = base + flare + (i === badTaper ? spec.step * 8 : 0);
    return {
      top: { thrust: fix(top + oval), axial: fix(top) },
      middle: { thrust: fix(base + oval), axial: fix(base) },
      bottom: { thrust: fix(base + oval), axial: fix(base - (rand() < 0.3 ? spec.step : 0)) },
      piston: Number((Math.round((spec.piston * spec.pistonGrowth) / spec.step) * spec.step).toFixed(spec.step < 0.001 ? 4 : 3)),
    };
  });
}

function recordFor(
  job: { cylinders: number; unit: 'in' | 'mm'; bore: number; piston: number; blockMaterial: JobInput['blockMaterial'] },
  seed: number,
  signedOffBy: string,
  badTaper?: number,
): InspectionInput {
  const inch = job.unit === 'in';
  const step = inch ? 0.0001 : 0.001;
  const temperatureC = 20 + (seed % 4);
  const growth = (material: NonNullable<JobInput['blockMaterial']>) => 1 + EXPANSION_COEFFICIENTS[material].alpha * (temperatureC - 20);
  return {
    // The inch shops read their thermometer in °F (exact: 68 °F = 20 °C, 1.8 °F per kelvin).
    conditions: inch
      ? { unit: job.unit, gaugeResolution: step, temperatureF: Number((temperatureC * 1.8 + 32).toFixed(1)), torquePlate: true }
      : { unit: job.unit, gaugeResolution: step, temperatureC, torquePlate: false },
    cylinders: readingsFor({ cylinders: job.cylinders, bore: job.bore, piston: job.piston, step, boreGrowth: growth(job.blockMaterial ?? 'cast-iron'), pistonGrowth: growth(PISTON_MATERIAL) }, seed, badTaper),
    deck: { readings: inch ? [0.0005, 0.001, 0.0015, 0.001, 0.0005] : [0.01, 0.02, 0.015, 0.01], raUm: 1.1 },
    finish: { mode: 'values', raUm: 0.42, rkUm: 0.55, rpkUm: 0.14, rvkUm: 1.35, mr1: 8, mr2: 86 },
    crosshatch: { mode: 'measured', includedAngleDeg: 44 + (seed % 4) },
    signedOffBy,
    notes: 'Measured at room temperature after the block had stood overnight in the inspection room.',
  };
}

// ---------------------------------------------------------------------------
// Jobs

interface JobPlan {
  key: string;
  builder: string;
  input: JobInput;
  /** The finished bore the shop aims for, in the job's unit (for the record's readings). */
  finishBore: number;
  photos: number;
  ageDays: number;
}

const inchV8 = (over: Partial<JobInput>): JobInput => ({
  title: '',
  engineFamily: 'Small-block V8, cast iron, 1970s',
  layout: 'v',
  cylinders: 8,
  blockMaterial: 'cast-iron',
  unit: 'in',
  stockBore: 4,
  stroke: 3.48,
  pistonDiameter: 4.0265,
  clearanceMin: 0.0035,
  clearanceMax: 0.0045,
  pistonType: 'forged',
  crosshatchMinDeg: 40,
  crosshatchMaxDeg: 50,
  finishRaMaxUm: 0.6,
  maxTaper: 0.0005,
  maxOutOfRound: 0.0005,
  deckFlatnessMax: 0.003,
  deckNotes: 'Deck to clean up, square to the main bore; take as little as it needs.',
  operations: [
    { code: 'bore', quantity: 8 },
    { code: 'torque-plate-hone', quantity: 8 },
    { code: 'deck', quantity: 1 },
  ],
  logistics: 'ship',
  country: 'United States',
  region: 'Ohio',
  city: 'Columbus',
  // Real postal codes of real towns (the people and shops stay invented), so the board can show distances.
  postalCode: '43215',
  neededBy: isoDay(30),
  notes: '',
  ...over,
});

const metricFour = (over: Partial<JobInput>): JobInput => ({
  ...inchV8({}),
  engineFamily: 'Inline-four, aluminium block with iron liners, 2.0 L',
  layout: 'inline',
  cylinders: 4,
  blockMaterial: 'aluminium',
  unit: 'mm',
  stockBore: 86,
  stroke: 86,
  pistonDiameter: 86.47,
  clearanceMin: 0.03,
  clearanceMax: 0.05,
  pistonType: 'cast',
  maxTaper: 0.01,
  maxOutOfRound: 0.008,
  deckFlatnessMax: 0.05,
  operations: [
    { code: 'bore', quantity: 4 },
    { code: 'plateau-hone', quantity: 4 },
  ],
  ...over,
});

export interface ScenarioOptions {
  appUrl: string;
  db: Database;
  log?: (line: string) => void;
}

/** Builds the demo jobs in every state; resolves to how many jobs were made. */
export async function buildDemoScenario(options: ScenarioOptions): Promise<number> {
  const log = options.log ?? (() => {});
  const sessions = new Map<string, HttpSession>();
  const as = async (email: string) => {
    let session = sessions.get(email);
    if (!session) {
      session = await HttpSession.signIn(options.appUrl, email, DEMO_PASSWORD);
      sessions.set(email, session);
    }
    return session;
  };
  const admin = await as('admin@tenthmark.test');
  /** The builder reads the waiting version and accepts it, naming each check that does not conform. */
  const acceptNewest = async (builderEmail: string, jobId: string) => {
    const builder = await as(builderEmail);
    const { versions } = await builder.call<InspectionView>('GET', `/api/jobs/${jobId}/inspection`);
    await builder.call('POST', `/api/jobs/${jobId}/inspection/accept`, acceptAsRead(versions[0]));
  };

  // Every demo shop finishes payout onboarding on the stand-in's page.
  const shopEmails = ['bench@lanternhill.test', 'desk@kessrow.test', 'floor@orrinvale.test', 'office@saltreed.test'];
  for (const email of shopEmails) {
    const shop = await as(email);
    const { url } = await shop.call<{ url: string }>('POST', '/api/shop-profile/payouts');
    const done = await submitHostedPage(url);
    if (done.status !== 303) throw new Error(`demo scenario: onboarding for ${email} answered ${done.status}`);
  }
  await waitFor('payout accounts ready', async () => {
    for (const email of shopEmails) {
      const own = await (await as(email)).call<{ shop: { payouts: string } }>('GET', '/api/shop-profile');
      if (own.shop.payouts !== 'ready') return false;
    }
    return true;
  });
  // Two shops are checked by the platform; a badge shows on their pages and bids.
  for (const name of ['Lantern Hill', 'Orrinvale']) {
    const { shops } = await admin.call<{ shops: Array<{ id: string }> }>('GET', `/api/admin/shops?q=${encodeURIComponent(name)}`);
    await admin.call('POST', `/api/admin/shops/${shops[0].id}/verification`, { verified: true });
  }

  let made = 0;
  const step = (text: string) => {
    made += 1;
    log(`demo job ${made}: ${text}`);
  };

  async function post(plan: JobPlan, publish = true) {
    const builder = await as(plan.builder);
    const { job } = await builder.call<{ job: { id: string } }>('POST', '/api/jobs', plan.input);
    if (plan.photos > 0) {
      const form = new FormData();
      for (let i = 0; i < plan.photos; i++) {
        const photo = await drawnPhoto(i % 2 === 0 ? 'deck' : 'bore', plan.input.cylinders, (plan.ageDays * 37 + i * 60) % 360);
        form.append('photos', new Blob([new Uint8Array(photo)], { type: 'image/jpeg' }), `photo-${i + 1}.jpg`);
      }
      await builder.call('POST', `/api/jobs/${job.id}/photos`, form);
    }
    if (publish) await builder.call('POST', `/api/jobs/${job.id}/publish`);
    return job.id;
  }

  async function bid(shopEmail: string, jobId: string, plan: JobPlan, extra: { turnaroundDays?: number; note?: string } = {}) {
    const shop = await as(shopEmail);
    const { shop: own } = await shop.call<{ shop: { rateCard: Array<{ operation: string; priceCents: number }> } }>('GET', '/api/shop-profile');
    const lines = prefillBidLines(plan.input.operations, own.rateCard).map((l) => ({ ...l, unitPriceCents: l.unitPriceCents || 4_000 }));
    const { bid: made } = await shop.call<{ bid: { id: string } }>('POST', `/api/jobs/${jobId}/bids`, {
      lineItems: lines.map(({ operation, description, quantity, unitPriceCents }) => ({ operation, description, quantity, unitPriceCents })),
      turnaroundDays: extra.turnaroundDays ?? 7,
      validUntil: isoDay(21),
      note: extra.note ?? '',
    });
    return made.id;
  }

  async function awardAndPay(plan: JobPlan, jobId: string, bidId: string, pay = true) {
    const builder = await as(plan.builder);
    await builder.call('POST', `/api/bids/${bidId}/accept`);
    if (!pay) return;
    const { url } = await builder.call<{ url: string }>('POST', `/api/jobs/${jobId}/checkout`);
    await submitHostedPage(url, { card_number: '4242424242424242' });
    await waitFor(`payment for ${plan.input.title}`, async () => (await builder.call<{ job: { status: string } }>('GET', `/api/jobs/${jobId}`)).job.status === 'funded');
  }

  async function talk(jobId: string, plan: JobPlan, shopEmail: string, lines: Array<['builder' | 'shop', string]>) {
    const shop = await as(shopEmail);
    const { thread } = await shop.call<{ thread: { id: string } }>('POST', `/api/jobs/${jobId}/threads`, {});
    for (const [who, body] of lines) {
      const session = who === 'shop' ? shop : await as(plan.builder);
      await session.call('POST', `/api/threads/${thread.id}/messages`, { clientId: `demo-${Math.random().toString(36).slice(2, 14)}`, body });
    }
  }

  async function logMilestones(shopEmail: string, jobId: string, entries: Array<Record<string, string>>) {
    const shop = await as(shopEmail);
    for (const entry of entries) await shop.call('POST', `/api/jobs/${jobId}/milestones`, entry);
  }

  const shopNames: Record<string, string> = {
    'bench@lanternhill.test': 'Wren Alder',
    'desk@kessrow.test': 'Iso Kessrow',
    'floor@orrinvale.test': 'Maren Dunlow',
    'office@saltreed.test': 'Cass Pellar',
  };

  async function throughRecord(plan: JobPlan, jobId: string, shopEmail: string, seed: number, badTaper?: number) {
    await logMilestones(shopEmail, jobId, [
      { kind: 'block_received', note: 'Arrived strapped to a pallet; caps and plugs bagged.' },
      { kind: 'teardown', note: 'Hot-tanked and magnafluxed: no cracks found. Old bores show a light ridge at the top.' },
      { kind: 'operation_started', operation: 'bore' },
      { kind: 'operation_finished', operation: 'bore', note: 'Bored to leave stock for the hone.' },
    ]);
    const record = recordFor({ cylinders: plan.input.cylinders, unit: plan.input.unit, bore: plan.finishBore, piston: plan.input.pistonDiameter!, blockMaterial: plan.input.blockMaterial }, seed, shopNames[shopEmail], badTaper);
    await (await as(shopEmail)).call('POST', `/api/jobs/${jobId}/inspection`, record);
  }

  /** The shop sends its record again after the builder asked for changes. */
  async function throughRecordAgain(plan: JobPlan, jobId: string, shopEmail: string, seed: number) {
    const record = recordFor({ cylinders: plan.input.cylinders, unit: plan.input.unit, bore: plan.finishBore, piston: plan.input.pistonDiameter!, blockMaterial: plan.input.blockMaterial }, seed + 1, shopNames[shopEmail]);
    await (await as(shopEmail)).call('POST', `/api/jobs/${jobId}/inspection`, record);
  }

  /** A job with no bore work leaves out the bore specification. */
  const noBoreWork: Partial<JobInput> = {
    stockBore: undefined,
    stroke: undefined,
    pistonDiameter: undefined,
    clearanceMin: undefined,
    clearanceMax: undefined,
    pistonType: undefined,
    crosshatchMinDeg: undefined,
    crosshatchMaxDeg: undefined,
    finishRaMaxUm: undefined,
    maxTaper: undefined,
    maxOutOfRound: undefined,
    deckFlatnessMax: undefined,
    deckNotes: '',
  };

  /** Received, worked on, and the record of its own sections submitted. */
  async function throughSections(jobId: string, shopEmail: string, sections: InspectionInput['sections'], note: string) {
    await logMilestones(shopEmail, jobId, [{ kind: 'block_received', note }]);
    await (await as(shopEmail)).call('POST', `/api/jobs/${jobId}/inspection`, {
      conditions: { unit: 'in', gaugeResolution: 0.0001, temperatureF: 69.8 },
      sections,
      signedOffBy: shopNames[shopEmail],
      notes: 'Measured after the parts had stood overnight in the inspection room.',
    });
  }

  const plans: Record<string, JobPlan> = {
    openWithBids: { key: 'open', builder: 'juno@builders.test', finishBore: 4.0305, photos: 2, ageDays: 2, input: inchV8({ title: 'Iron small-block V8: bore .030 over, torque-plate hone, deck', notes: 'Forged pistons in hand, measured and tagged per cylinder. Block has a light rust ring in two bores.' }) },
    openMetric: { key: 'open-metric', builder: 'teodor@builders.test', finishBore: 86.51, photos: 1, ageDays: 1, input: metricFour({ title: 'Aluminium inline-four: bore and plateau-hone to new pistons', region: 'Oregon', city: 'Eugene', postalCode: '97401', logistics: 'drop-off' }) },
    draft: { key: 'draft', builder: 'mireille@builders.test', finishBore: 4.2805, photos: 0, ageDays: 0, input: inchV8({ title: 'Big-block V8: line hone and deck (still writing this up)', engineFamily: 'Big-block V8, cast iron', stockBore: 4.25, pistonDiameter: 4.2765, operations: [{ code: 'line-hone', quantity: 1 }, { code: 'deck', quantity: 1 }] }) },
    awaitingPayment: { key: 'awarded', builder: 'teodor@builders.test', finishBore: 86.51, photos: 1, ageDays: 4, input: metricFour({ title: 'Inline-four for a hill-climb car: bore and hone', region: 'Indiana', city: 'Fort Wayne', postalCode: '46802' }) },
    funded: { key: 'funded', builder: 'juno@builders.test', finishBore: 4.0305, photos: 1, ageDays: 6, input: inchV8({ title: 'Marine V8 block: bore and hone after a flood', region: 'Georgia', city: 'Brunswick', postalCode: '31520', neededBy: isoDay(40) }) },
    inWork: { key: 'in-work', builder: 'juno@builders.test', finishBore: 4.0305, photos: 2, ageDays: 12, input: inchV8({ title: 'Circle-track V8: bore, torque-plate hone, deck square', neededBy: isoDay(18) }) },
    submitted: { key: 'submitted', builder: 'mireille@builders.test', finishBore: 4.0305, photos: 2, ageDays: 15, input: inchV8({ title: 'Street V8 rebuild: .030 over with plateau finish', region: 'Oregon', city: 'Salem', postalCode: '97301', neededBy: isoDay(10) }) },
    done1: { key: 'done-1', builder: 'teodor@builders.test', finishBore: 4.0305, photos: 1, ageDays: 40, input: inchV8({ title: 'Tow-truck V8: bore and hone', neededBy: isoDay(5) }) },
    done2: { key: 'done-2', builder: 'mireille@builders.test', finishBore: 86.51, photos: 1, ageDays: 35, input: metricFour({ title: 'Rally four-cylinder: hone to fit', region: 'Indiana', city: 'Bloomington', postalCode: '47401', neededBy: isoDay(6) }) },
    done3: { key: 'done-3', builder: 'juno@builders.test', finishBore: 4.0305, photos: 1, ageDays: 30, input: inchV8({ title: 'Hot-rod V8: bore, hone and deck for a rebuild', region: 'Oregon', city: 'Bend', postalCode: '97701', neededBy: isoDay(7) }) },
    done4: { key: 'done-4', builder: 'teodor@builders.test', finishBore: 4.0305, photos: 1, ageDays: 25, input: inchV8({ title: 'Fishing-boat V8: hone and deck', region: 'Georgia', city: 'Savannah', postalCode: '31401', neededBy: isoDay(8) }) },
    disputed: { key: 'disputed', builder: 'mireille@builders.test', finishBore: 4.0305, photos: 2, ageDays: 20, input: inchV8({ title: 'Drag V8: bore, hone, deck (tight taper limit)', region: 'Georgia', city: 'Macon', postalCode: '31201', maxTaper: 0.0003, neededBy: isoDay(9) }) },
    resolved: { key: 'resolved', builder: 'teodor@builders.test', finishBore: 4.0305, photos: 1, ageDays: 45, input: inchV8({ title: 'Work-truck V8: bore and hone', neededBy: isoDay(4) }) },
    bottomEnd: {
      key: 'bottom-end',
      builder: 'juno@builders.test',
      finishBore: 0,
      photos: 0,
      ageDays: 14,
      input: inchV8({
        title: 'Big-block bottom end: line hone the mains, grind the crank .010 under',
        engineFamily: 'Big-block V8, cast iron, 1960s',
        parts: ['block', 'crankshaft'],
        ...noBoreWork,
        operations: [
          { code: 'line-hone', quantity: 1 },
          { code: 'crank-grind', quantity: 1 },
        ],
        limits: { lineHone: { housingMin: 2.9365, housingMax: 2.9375 }, crankGrind: { mainStandard: 2.7495, rodStandard: 2.1985 } },
        region: 'Indiana',
        city: 'Muncie',
        postalCode: '47305',
        neededBy: isoDay(12),
      }),
    },
    balanced: {
      key: 'balanced',
      builder: 'teodor@builders.test',
      finishBore: 0,
      photos: 0,
      ageDays: 22,
      input: inchV8({
        title: 'Rotating assembly to balance for a 7,000 rpm build',
        parts: ['rotating-assembly'],
        ...noBoreWork,
        blockMaterial: undefined,
        operations: [{ code: 'balance', quantity: 1 }],
        limits: { balance: { grade: 2.5, serviceRpm: 7000 } },
        neededBy: isoDay(9),
      }),
    },
    heads: {
      key: 'heads',
      builder: 'mireille@builders.test',
      finishBore: 0,
      photos: 0,
      ageDays: 10,
      input: inchV8({
        title: 'Pair of aluminium heads: resurface and a three-angle valve job',
        engineFamily: 'Small-block V8 aluminium heads, 64 cc chambers',
        parts: ['heads'],
        blockMaterial: 'aluminium',
        ...noBoreWork,
        operations: [
          { code: 'head-resurface', quantity: 2 },
          { code: 'valve-job', quantity: 2 },
        ],
        limits: { headResurface: { maxStockRemoved: 0.005 }, valveJob: { installedHeight: 1.8, springPressureMin: 120 } },
        region: 'Oregon',
        city: 'Medford',
        postalCode: '97501',
        neededBy: isoDay(11),
      }),
    },
    // Lantern Hill's earlier jobs for one builder, so its standing (and the builder's) has enough history to show figures.
    ...Object.fromEntries(
      ['Dirt-track V8', 'Shop-truck V8', 'Tractor-pull V8', 'Ski-boat V8', 'Delivery-van V8'].map((engine, i) => [
        `earlier${i + 1}`,
        { key: `earlier-${i + 1}`, builder: 'teodor@builders.test', finishBore: 4.0305, photos: 0, ageDays: 90 - i * 9, input: inchV8({ title: `${engine}: bore and hone`, logistics: 'drop-off', neededBy: isoDay(12 + i) }) },
      ]),
    ),
    cancelled: { key: 'cancelled', builder: 'juno@builders.test', finishBore: 4.0305, photos: 0, ageDays: 9, input: inchV8({ title: 'Spare V8 block: deck only (sold the block)', operations: [{ code: 'deck', quantity: 1 }] }) },
  };
  const ids: Record<string, string> = {};

  // Open, with bids from three shops and a question in the conversation.
  ids.openWithBids = await post(plans.openWithBids);
  await bid('bench@lanternhill.test', ids.openWithBids, plans.openWithBids, { turnaroundDays: 8, note: 'Torque plates for this family are on the shelf.' });
  await bid('desk@kessrow.test', ids.openWithBids, plans.openWithBids, { turnaroundDays: 5 });
  await bid('floor@orrinvale.test', ids.openWithBids, plans.openWithBids, { turnaroundDays: 10, note: 'Can start the week after next.' });
  await talk(ids.openWithBids, plans.openWithBids, 'desk@kessrow.test', [
    ['shop', 'Are the rust rings deep enough to catch a fingernail? If so we may need the full .030 to clean up.'],
    ['builder', 'One of them does, barely. The pistons are .030 over, so that works.'],
  ]);
  step('open with three bids');

  ids.openMetric = await post(plans.openMetric);
  step('open, waiting for bids');
  ids.draft = await post(plans.draft, false);
  step('a draft');

  ids.awaitingPayment = await post(plans.awaitingPayment);
  await awardAndPay(plans.awaitingPayment, ids.awaitingPayment, await bid('desk@kessrow.test', ids.awaitingPayment, plans.awaitingPayment), false);
  step('bid accepted, waiting for payment');

  ids.funded = await post(plans.funded);
  await awardAndPay(plans.funded, ids.funded, await bid('office@saltreed.test', ids.funded, plans.funded, { turnaroundDays: 9 }));
  step('paid and held');

  ids.inWork = await post(plans.inWork);
  await awardAndPay(plans.inWork, ids.inWork, await bid('bench@lanternhill.test', ids.inWork, plans.inWork));
  await talk(ids.inWork, plans.inWork, 'bench@lanternhill.test', [
    ['shop', 'Block is in. We will bore tomorrow and hone with the plate on Thursday.'],
    ['builder', 'Great. Please keep the deck cut to the minimum; the heads are already milled.'],
    ['shop', 'Understood. We will measure the deck before and after and note both.'],
  ]);
  await logMilestones('bench@lanternhill.test', ids.inWork, [
    { kind: 'block_received', note: 'Received by freight; caps stamped and bagged.' },
    { kind: 'teardown', note: 'Cleaned and crack-checked: sound. Cylinder six has a scuff that cleans up at .020.' },
    { kind: 'operation_started', operation: 'bore' },
    { kind: 'operation_finished', operation: 'bore', note: 'All eight bored to 4.0270 in, leaving stock for the hone.' },
    { kind: 'operation_started', operation: 'torque-plate-hone' },
  ]);
  step('in the shop, with progress logged');

  ids.submitted = await post(plans.submitted);
  await awardAndPay(plans.submitted, ids.submitted, await bid('floor@orrinvale.test', ids.submitted, plans.submitted));
  await throughRecord(plans.submitted, ids.submitted, 'floor@orrinvale.test', 11);
  step('inspection record waiting for the builder');

  const reviews: Array<[keyof typeof plans, string, number, string, number, string]> = [
    ['done1', 'bench@lanternhill.test', 5, 'Every bore within a tenth of the next, and the record matched my own gauge.', 5, 'Clear specs, paid at once, picked up on the day.'],
    ['done2', 'desk@kessrow.test', 4, 'Good work and quick; the finish was a touch rougher than I asked but inside the limit.', 5, 'Knew exactly what the engine needed; easy to work with.'],
    ['done3', 'floor@orrinvale.test', 5, 'Careful shop. Photos at every step and a tidy record.', 4, 'Good builder; the pistons arrived a few days after the block.'],
    ['done4', 'office@saltreed.test', 3, 'The work passed, but it took a week longer than the bid said.', 4, 'Fair and patient while we waited on a hone stone.'],
  ];
  let seed = 21;
  for (const [key, shopEmail, shopStars, shopWords, builderStars, builderWords] of reviews) {
    const plan = plans[key];
    ids[key] = await post(plan);
    await awardAndPay(plan, ids[key], await bid(shopEmail, ids[key], plan));
    await throughRecord(plan, ids[key], shopEmail, (seed += 7));
    await acceptNewest(plan.builder, ids[key]);
    await waitFor('the payout', async () => (await (await as(plan.builder)).call<{ job: { status: string } }>('GET', `/api/jobs/${ids[key]}`)).job.status === 'completed');
    await (await as(plan.builder)).call('POST', `/api/jobs/${ids[key]}/reviews`, { rating: shopStars, comment: shopWords });
    await (await as(shopEmail)).call('POST', `/api/jobs/${ids[key]}/reviews`, { rating: builderStars, comment: builderWords });
    step('completed, paid out and reviewed');
  }

  // Lantern Hill's earlier work for Teodor: a question answered, the record, "ready for pickup", accepted (one sent back once first).
  const earlierAnswers = ['The block has a freeze-plug leak; can you replace the plugs too?', 'Can you keep the old pistons for me to weigh?', 'Is a torque plate needed for this block?', 'Could you check the lifter bores while it is there?', 'What finish do you leave for moly rings?'];
  for (let i = 1; i <= 5; i += 1) {
    const key = `earlier${i}`;
    const plan = plans[key];
    ids[key] = await post(plan);
    await awardAndPay(plan, ids[key], await bid('bench@lanternhill.test', ids[key], plan, { turnaroundDays: 6 }));
    await talk(ids[key], plan, 'bench@lanternhill.test', [
      ['builder', earlierAnswers[i - 1]],
      ['shop', 'Yes, we can do that; it is noted on the job.'],
    ]);
    await throughRecord(plan, ids[key], 'bench@lanternhill.test', 100 + i);
    if (i === 3) {
      await (await as(plan.builder)).call('POST', `/api/jobs/${ids[key]}/inspection/reject`, { version: 1, reasons: 'Please add the deck readings; the record leaves them out.' });
      await throughRecordAgain(plan, ids[key], 'bench@lanternhill.test', 100 + i);
    }
    await logMilestones('bench@lanternhill.test', ids[key], [{ kind: 'ready_for_pickup', note: 'Bagged and on the pickup shelf.' }]);
    await acceptNewest(plan.builder, ids[key]);
    await waitFor('the payout', async () => (await (await as(plan.builder)).call<{ job: { status: string } }>('GET', `/api/jobs/${ids[key]}`)).job.status === 'completed');
    step('earlier work of Lantern Hill, completed');
  }
  // Each builder's question waited a while before the shop's answer (messages are sent seconds apart above).
  await options.db.execute(sql`
    UPDATE messages m SET created_at = m.created_at - (20 + 10 * (ascii(m.body) % 5)) * interval '1 minute'
    FROM threads t JOIN jobs j ON j.id = t.job_id
    WHERE m.thread_id = t.id AND m.author_id = j.builder_id AND t.job_id IN (${sql.join([1, 2, 3, 4, 5].map((i) => sql`${ids[`earlier${i}`]}::uuid`), sql`, `)})`);

  // Disputed: the record shows one bore over the tight taper limit; the builder disputes, the shop answers.
  ids.disputed = await post(plans.disputed);
  await awardAndPay(plans.disputed, ids.disputed, await bid('office@saltreed.test', ids.disputed, plans.disputed));
  await throughRecord(plans.disputed, ids.disputed, 'office@saltreed.test', 77, 3);
  await (await as(plans.disputed.builder)).call('POST', `/api/jobs/${ids.disputed}/dispute`, {
    reason: 'record_outside_limits',
    statement: 'Cylinder four is over the taper limit on the shop’s own record, and a second hone would take it past the piston clearance. I want part of the price back.',
  });
  await (await as('office@saltreed.test')).call('POST', `/api/jobs/${ids.disputed}/dispute/response`, {
    statement: 'The taper on cylinder four is 0.0008 in against a 0.0003 in limit that we flagged as tight before bidding. We can re-hone it with an oversize piston supplied by the builder.',
  });
  step('disputed and answered, waiting for an administrator');

  // Resolved: a dispute the administrator decided with a split.
  ids.resolved = await post(plans.resolved);
  await awardAndPay(plans.resolved, ids.resolved, await bid('desk@kessrow.test', ids.resolved, plans.resolved));
  await throughRecord(plans.resolved, ids.resolved, 'desk@kessrow.test', 91, 6);
  await (await as(plans.resolved.builder)).call('POST', `/api/jobs/${ids.resolved}/dispute`, {
    reason: 'record_outside_limits',
    statement: 'Cylinder seven is outside the taper limit on the record; the block needs another visit to a shop.',
  });
  const { disputes } = await admin.call<{ disputes: Array<{ id: string; jobId: string; heldCents: number }> }>('GET', '/api/admin/disputes');
  const toDecide = disputes.find((d) => d.jobId === ids.resolved)!;
  await admin.call('POST', `/api/admin/disputes/${toDecide.id}/resolve`, {
    outcome: 'split',
    shopCents: Math.round(toDecide.heldCents * 0.7),
    decision: 'Seven of eight bores meet every limit and the eighth is close; the shop keeps 70 % for the work done and 30 % is refunded toward a re-hone elsewhere.',
  });
  step('dispute decided by a split');

  // Work beyond the bores, each through its own sections of the record (readings invented, plausible).
  ids.bottomEnd = await post(plans.bottomEnd);
  await awardAndPay(plans.bottomEnd, ids.bottomEnd, await bid('bench@lanternhill.test', ids.bottomEnd, plans.bottomEnd, { turnaroundDays: 7 }));
  await throughSections(ids.bottomEnd, 'bench@lanternhill.test', bottomEndSections(), 'Block and crank arrived together; main caps numbered and bagged.');
  step('line hone and crank grind: record waiting, one rod journal under size');

  ids.balanced = await post(plans.balanced);
  await awardAndPay(plans.balanced, ids.balanced, await bid('desk@kessrow.test', ids.balanced, plans.balanced, { turnaroundDays: 4 }));
  await throughSections(ids.balanced, 'desk@kessrow.test', balanceSections(), 'Crank, rods, pistons, pins, rings and bearings received, each bagged by cylinder.');
  await acceptNewest(plans.balanced.builder, ids.balanced);
  await waitFor('the payout', async () => (await (await as(plans.balanced.builder)).call<{ job: { status: string } }>('GET', `/api/jobs/${ids.balanced}`)).job.status === 'completed');
  step('balanced, accepted and paid out');

  ids.heads = await post(plans.heads);
  await awardAndPay(plans.heads, ids.heads, await bid('floor@orrinvale.test', ids.heads, plans.heads, { turnaroundDays: 6 }));
  await throughSections(ids.heads, 'floor@orrinvale.test', headSections(), 'Both heads received with valves, springs and retainers in labelled trays.');
  step('head job: record waiting');

  ids.cancelled = await post(plans.cancelled);
  await (await as(plans.cancelled.builder)).call('POST', `/api/jobs/${ids.cancelled}/cancel`, {});
  step('cancelled before any bid');

  // Spread the jobs over the past weeks so ages and the board's order look lived-in.
  // Raw SQL, so the schema's $onUpdate does not touch updated_at: on purpose, backdating is not a change to the job.
  for (const [key, id] of Object.entries(ids)) {
    const age = plans[key].ageDays;
    await options.db.execute(sql`
      UPDATE jobs SET created_at = created_at - ${age} * interval '1 day',
                      published_at = published_at - ${Math.max(0, age - 0.2)} * interval '1 day'
      WHERE id = ${id}`);
  }
  await options.db.execute(sql`UPDATE disputes SET opened_at = opened_at - interval '2 days' WHERE job_id = ${ids.disputed}`);
  return made;
}

async function waitFor(what: string, check: () => Promise<boolean>, timeoutMs = 20_000) {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`demo scenario: timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

// ---------------------------------------------------------------------------
// Records beyond the bores (invented, plausible readings in inches at 21 °C)

const journalAt = (size: number, oval = 0, taper = 0) => ({ front: { vertical: size, horizontal: size - oval }, rear: { vertical: size - taper, horizontal: size - taper - oval } });

/** Five main housing bores just inside 2.9365–2.9375 in, straight on the bar; mains and rods .010 under, one rod journal a tenth under its range. */
function bottomEndSections(): InspectionInput['sections'] {
  const housing = (v: number, s: number, centre: number) => ({ vertical: { front: v, rear: v + 0.0001 }, second: { front: s, rear: s }, centre });
  return {
    lineHone: {
      secondDirection: '45',
      bores: [housing(2.9371, 2.937, 0), housing(2.9372, 2.9371, 0.0001), housing(2.9371, 2.9371, 0.0002), housing(2.9372, 2.937, 0.0001), housing(2.9371, 2.9371, 0)],
    },
    crankGrind: {
      undersize: 0.01,
      mains: Array.from({ length: 5 }, (_, i) => journalAt(2.7394 - (i % 2) * 0.0001, 0.0001)),
      rods: Array.from({ length: 8 }, (_, i) => journalAt(i === 5 ? 2.1877 : 2.1884 - (i % 3) * 0.0001, 0.0001)),
      raUm: 0.18,
    },
  };
}

/** Weighed parts of a V8 rotating assembly and the residual after two correction runs. */
function balanceSections(): InspectionInput['sections'] {
  return {
    balance: {
      rotatingGrams: 1264,
      reciprocatingGrams: 1196,
      bobWeightGrams: 1862.5,
      rotorMassKg: 22.7,
      grade: 2.5,
      serviceRpm: 7000,
      residual: [
        { plane: 'front', gmm: 24 },
        { plane: 'rear', gmm: 31 },
      ],
    },
  };
}

/** Two heads surfaced flat; sixteen valves set to height. */
function headSections(): InspectionInput['sections'] {
  const positions = ['lengthwise, left edge', 'lengthwise, centre', 'lengthwise, right edge', 'diagonal A', 'diagonal B'];
  const head = (worst: number, stock: number) => ({ straightedge: positions.map((position, i) => ({ position, value: i === 1 ? worst : 0.0005 })), stockRemoved: stock, chamberBeforeCc: 64.2, chamberAfterCc: 63.4 });
  return {
    headResurface: { heads: [head(0.001, 0.004), head(0.0008, 0.003)] },
    valveJob: {
      valves: Array.from({ length: 16 }, (_, i) => {
        const exhaust = i % 2 === 1;
        return {
          label: `${Math.floor(i / 2) + 1} ${exhaust ? 'exhaust' : 'intake'}`,
          kind: exhaust ? ('exhaust' as const) : ('intake' as const),
          seatWidth: exhaust ? 0.07 : 0.05,
          installedHeight: 1.8 + (i % 3) * 0.002,
          stemToGuide: exhaust ? 0.0022 : 0.0016,
          springPressure: 128 + (i % 4),
        };
      }),
    },
  };
}
