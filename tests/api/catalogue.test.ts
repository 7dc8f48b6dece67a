import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { operationCodes, operations } from '../../shared/catalogue';
import { measurementKinds } from '../../shared/measurement-sheets';
import { setupTestApp, type TestContext } from '../setup/test-env';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await setupTestApp();
});
afterAll(async () => {
  await ctx?.close();
});

describe('GET /api/catalogue', () => {
  it('when anyone asks, signed out, then every one of the fourteen operations comes with a non-empty inspection sheet', async () => {
    const res = await supertest(ctx.app).get('/api/catalogue');
    expect(res.status).toBe(200);
    const listed = res.body.operations as Array<{ code: string; name: string; description: string; pricedPer: string; part: string; measurements: Array<{ key: string; label: string; kind: string }> }>;
    expect(listed.map((op) => op.code)).toEqual(operationCodes);
    expect(listed).toHaveLength(14);
    for (const op of listed) {
      const own = operations.find((o) => o.code === op.code)!;
      expect(op).toMatchObject({ name: own.name, description: own.description, pricedPer: own.pricedPer, part: own.part });
      expect(op.measurements.length, op.code).toBeGreaterThan(0);
      expect(new Set(op.measurements.map((m) => m.key)).size, `${op.code}: keys unique`).toBe(op.measurements.length);
      for (const m of op.measurements) {
        expect(Object.keys(m).sort()).toEqual(['key', 'kind', 'label']);
        expect(measurementKinds).toContain(m.kind);
        expect(m.label.length).toBeGreaterThan(3);
      }
    }
  });

  it('when a sheet is read, then it measures what the work is judged on', async () => {
    const res = await supertest(ctx.app).get('/api/catalogue');
    const sheet = (code: string) => (res.body.operations as Array<{ code: string; measurements: Array<{ key: string; kind: string }> }>).find((op) => op.code === code)!.measurements;
    expect(sheet('hone').map((m) => m.key)).toEqual(expect.arrayContaining(['boreDiameter', 'finishRa', 'crosshatchAngle', 'honeStones']));
    expect(sheet('line-hone').map((m) => m.key)).toEqual(expect.arrayContaining(['housingBore', 'alignment']));
    expect(sheet('crank-grind').map((m) => m.key)).toEqual(expect.arrayContaining(['mainJournal', 'rodJournal', 'undersize']));
    expect(sheet('balance').find((m) => m.key === 'residualUnbalance')?.kind).toBe('unbalance');
    expect(sheet('crack-test').map((m) => m.kind)).toEqual(expect.arrayContaining(['choice', 'text', 'photos']));
  });
});
