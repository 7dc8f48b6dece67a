import { describe, expect, it } from 'vitest';
import { inspectionInputSchema, type InspectionInput } from '../../shared/schemas/inspection';
import { checkRecord, emptyRecord, fromDraft, fromInput, pathWords, toDraft, toRawInput } from '../../client/features/inspections/lib/record-form';
import { deckPositions, sectionsFromFields } from '../../client/features/inspections/lib/section-fields';
import { versionChanges } from '../../client/features/inspections/lib/version-diff';
import type { InspectionVersion } from '../../shared/schemas/inspection';

/** Every section filled, as a shop would type it (figures invented for the test). */
function filledForm() {
  const form = emptyRecord('in');
  form.gaugeResolution = '0.0001';
  form.temperatureC = '20';
  form.signedOffBy = 'Rhea Okafor';
  const f: Record<string, string> = {
    'sections.clean.method': 'hot-tank',
    'sections.clean.result': 'clean',
    'sections.clean.findings': 'Scale out of the water jackets.',
    'sections.clean.photoIds': '7d4f2c1e-2b9a-4c3d-8e5f-1a2b3c4d5e6f',
    'sections.crackTest.method': 'magnetic-particle',
    'sections.crackTest.result': 'no-crack',
    'sections.hone.stones': '280 grit then 400 plateau',
    'sections.lineHone.secondDirection': '45',
    'sections.camBore.bearings.0': '2.1250',
    'sections.camBore.bearings.1': '2.1252',
    'sections.sleeve.cylinders.2.blockBore': '4.2480',
    'sections.sleeve.cylinders.2.sleeveOutside': '4.2510',
    'sections.headResurface.heads.0.straightedge.0.value': '0.0010',
    'sections.headResurface.heads.0.straightedge.7.value': '0.0015',
    'sections.headResurface.heads.0.stockRemoved': '0.005',
    'sections.valveJob.valves.0.seatWidth': '0.060',
    'sections.valveJob.valves.0.installedHeight': '1.800',
    'sections.valveJob.valves.0.stemToGuide': '0.0015',
    'sections.valveJob.valves.3.seatWidth': '0.080',
    'sections.valveJob.valves.3.installedHeight': '1.795',
    'sections.valveJob.valves.3.stemToGuide': '0.0020',
    'sections.valveJob.valves.3.springPressure': '110',
    'sections.crankGrind.undersize': '0.010',
    'sections.crankGrind.raUm': '0.2',
    'sections.balance.rotatingGrams': '1580',
    'sections.balance.reciprocatingGrams': '1260',
    'sections.balance.bobWeightGrams': '2210',
    'sections.balance.rotorMassKg': '23',
    'sections.balance.grade': '6.3',
    'sections.balance.serviceRpm': '6500',
    'sections.balance.residual.0.gmm': '120',
    'sections.balance.residual.1.gmm': '95',
    'deck.straightedge.lengthwise, left edge': '0.0008',
    'deck.straightedge.across cylinder 3': '0.0011',
    'deck.heights.frontLeft': '9.025',
    'deck.heights.frontRight': '9.026',
    'deck.heights.rearLeft': '9.024',
    'deck.heights.rearRight': '9.025',
    // How many rows each table is drawn with.
    'rows.lineHone': '5',
    'rows.camBore': '2',
    'rows.headResurface': '1',
    'rows.valveJob': '4',
    'rows.crankMains': '2',
    'rows.crankRods': '2',
  };
  for (let i = 0; i < 5; i++) {
    for (const key of ['vertical.front', 'vertical.rear', 'second.front', 'second.rear']) f[`sections.lineHone.bores.${i}.${key}`] = (2.6406 + i / 10_000).toFixed(4);
  }
  for (const kind of ['mains', 'rods']) {
    for (let i = 0; i < 2; i++) {
      for (const key of ['front.vertical', 'front.horizontal', 'rear.vertical', 'rear.horizontal']) f[`sections.crankGrind.${kind}.${i}.${key}`] = kind === 'mains' ? '2.4385' : '2.0885';
    }
  }
  form.fields = f;
  return form;
}

describe('record form sections', () => {
  it('turns the typed sections into a request the shared schema accepts', () => {
    const check = checkRecord(filledForm(), 0);
    expect(check.order).toEqual([]);
    const input = check.input!;
    expect(input.cylinders).toBeUndefined();
    expect(input.sections?.lineHone?.bores).toHaveLength(5);
    expect(input.sections?.sleeve?.cylinders).toEqual([{ cylinder: 3, blockBore: 4.248, sleeveOutside: 4.251 }]);
    expect(input.sections?.valveJob?.valves.map((v) => [v.label, v.kind])).toEqual([
      ['1 intake', 'intake'],
      ['2 exhaust', 'exhaust'],
    ]);
    expect(input.sections?.headResurface?.heads[0].straightedge).toEqual([
      { position: 'lengthwise, left', value: 0.001 },
      { position: 'diagonal B', value: 0.0015 },
    ]);
    expect(input.sections?.balance?.residual).toEqual([
      { plane: 'front', gmm: 120 },
      { plane: 'rear', gmm: 95 },
    ]);
    expect(input.sections?.clean?.photoIds).toEqual(['7d4f2c1e-2b9a-4c3d-8e5f-1a2b3c4d5e6f']);
    expect(input.deck?.straightedge).toEqual([
      { position: 'lengthwise, left edge', value: 0.0008 },
      { position: 'across cylinder 3', value: 0.0011 },
    ]);
    expect(input.deck?.heights).toEqual({ frontLeft: 9.025, frontRight: 9.026, rearLeft: 9.024, rearRight: 9.025 });
  });

  it('round-trips form → input → form without losing a reading', () => {
    const form = filledForm();
    const input = checkRecord(form, 0).input as InspectionInput;
    const again = fromInput(input);
    expect(again.fields).toEqual(
      // Numbers come back in their shortest form ("0.0010" → "0.001"); the request they make is the same.
      Object.fromEntries(Object.entries(form.fields).map(([path, value]) => [path, /^[\d.]+$/.test(value) ? String(Number(value)) : value])),
    );
    expect(inspectionInputSchema.parse(toRawInput(again, 0))).toEqual(input);
  });

  it('keeps the sections through a draft save and reload', () => {
    const form = filledForm();
    form.fields['rows.lineHone'] = '7';
    form.fields['sections.balance.oilGrams'] = '4'; // half typed is kept as typed
    const restored = fromDraft(JSON.parse(JSON.stringify(toDraft(form))) as Record<string, unknown>, 'in');
    expect(restored?.fields).toEqual(form.fields);
  });

  it('leaves blank rows and blank sections out, and reports a half-filled row as missing', () => {
    expect(sectionsFromFields({ 'sections.camBore.bearings.0': ' ', 'sections.balance.residual.1.gmm': '' })).toBeUndefined();
    const form = emptyRecord('mm');
    form.gaugeResolution = '0.001';
    form.temperatureC = '20';
    form.signedOffBy = 'Rhea Okafor';
    form.fields = { 'sections.lineHone.secondDirection': 'horizontal', 'sections.lineHone.bores.0.vertical.front': '67.01' };
    const check = checkRecord(form, 0);
    expect(check.missing['sections.lineHone.bores.0.vertical.rear']).toBeDefined();
    expect(check.errors['sections.lineHone.bores']).toBe('Enter at least two main housing bores.');
    expect(pathWords('sections.lineHone.bores.0.vertical.rear')).toBe('line hone: bores 1 vertical rear');
    expect(pathWords('sections.balance.bobWeightGrams')).toBe('balance: bob weight grams');
  });

  it('lays the deck positions out from the cylinder count', () => {
    expect(deckPositions(4).map((p) => p.position)).toEqual([
      'lengthwise, left edge',
      'lengthwise, centre',
      'lengthwise, right edge',
      'across cylinder 1',
      'across cylinder 2',
      'across cylinder 3',
      'across cylinder 4',
      'diagonal A',
      'diagonal B',
    ]);
  });

  it('names a changed section reading and a changed section verdict between two versions', () => {
    const input = checkRecord(filledForm(), 0).input!;
    const version = (n: number, front: number, verdict: 'fails' | 'conforms'): InspectionVersion => ({
      id: `00000000-0000-4000-8000-00000000000${n}`,
      version: n,
      status: 'submitted',
      input: { ...input, sections: { ...input.sections, lineHone: { ...input.sections!.lineHone!, bores: input.sections!.lineHone!.bores.map((b, i) => (i === 1 ? { ...b, vertical: { ...b.vertical, front } } : b)) } } },
      results: { checks: [], pass: verdict === 'conforms', sections: [{ operation: 'line-hone', name: 'Line hone', verdict, covers: ['line-hone'], figures: [], statements: [] }] },
      submittedAt: '2026-12-01T10:00:00.000Z',
      decidedAt: null,
      rejectReasons: null,
      replacedBy: null,
    });
    const changes = versionChanges(version(1, 2.6431, 'fails'), version(2, 2.6411, 'conforms'));
    expect(changes.map(({ what, before, after }) => [what, before, after])).toEqual([
      ['Line hone: bores 2 vertical front', '2.6431', '2.6411'],
      ['Line hone (judged)', 'Fails', 'Conforms'],
      ['Overall result', 'Fail: at least one check fails', 'Pass: every limit judged, every check conforms'],
    ]);
  });
});
