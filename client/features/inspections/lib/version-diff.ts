/**
 * What changed between two versions of an inspection record: each reading
 * and condition as typed, and the worked-out figures, named in words.
 */
import { NOTHING_JUDGED_WORDS, SECTION_VERDICT_WORDS, judgedNothing } from '@shared/inspection-words';
import type { InspectionVersion } from '@shared/schemas/inspection';
import { RECORD_VERDICT_WORDS, recordVerdict } from '@shared/schemas/values';
import { DEPTHS, DIRECTIONS } from '@client/lib/bore-readings';
import { formatLength, formatNumber, lengthToText, numberToText } from '@client/lib/numbers';
import { fieldsFromInput, sectionPathWords } from './section-fields';

export interface VersionChange {
  key: string;
  what: string;
  before: string;
  after: string;
}

type Entry = [key: string, what: string, text: string];

function entries(version: InspectionVersion): Entry[] {
  const { input, results } = version;
  const unit = input.conditions.unit;
  const len = (value: number | undefined) => (value === undefined ? '—' : `${lengthToText(value, unit)} ${unit}`);
  const um = (value: number | undefined) => (value === undefined ? '—' : `${numberToText(value)} µm`);
  const list: Entry[] = [
    ['unit', 'Units', unit === 'in' ? 'inches' : 'millimetres'],
    ['resolution', 'Gauge resolution', len(input.conditions.gaugeResolution)],
    ['temperature', 'Temperature', input.conditions.temperatureF !== undefined ? `${numberToText(input.conditions.temperatureF)} °F` : `${numberToText(input.conditions.temperatureC)} °C`],
    ['uncertainty', 'Measurement uncertainty', input.conditions.uncertainty !== undefined ? len(input.conditions.uncertainty) : 'gauge resolution (lower bound)'],
    ['torque-plate', 'Torque plate', input.conditions.torquePlate ? 'fitted' : 'not fitted'],
  ];
  (input.cylinders ?? []).forEach((cylinder, i) => {
    for (const depth of DEPTHS) {
      for (const direction of DIRECTIONS) list.push([`c${i}.${depth}.${direction}`, `Cylinder ${i + 1} ${depth} ${direction}`, len(cylinder[depth][direction])]);
    }
    list.push([`c${i}.piston`, `Cylinder ${i + 1} piston diameter`, len(cylinder.piston)]);
  });
  list.push(['deck', 'Straightedge readings', input.deck ? [...(input.deck.readings ?? []).map((r) => len(r)), ...(input.deck.straightedge ?? []).map((r) => `${r.position} ${len(r.value)}`)].join(', ') || '—' : '—']);
  list.push(['deck-ra', 'Deck Ra', um(input.deck?.raUm)]);
  if (input.finish?.mode === 'profile') {
    const filter = input.finish.filter;
    const filterWords = filter?.kind === 'gaussian' ? `Gaussian filter, cut-off ${numberToText(filter.cutoffMm)} mm` : 'no filter';
    list.push(['finish', 'Bore finish', `from a trace of ${input.finish.heightsUm.length.toLocaleString('en-US')} heights at ${numberToText(input.finish.spacingUm)} µm, ${filterWords}`]);
  } else if (input.finish?.mode === 'values') {
    const f = input.finish;
    list.push(['finish', 'Bore finish', 'entered values']);
    list.push(['finish-ra', 'Bore Ra (entered)', um(f.raUm)], ['finish-rk', 'Rk (entered)', um(f.rkUm)], ['finish-rpk', 'Rpk (entered)', um(f.rpkUm)], ['finish-rvk', 'Rvk (entered)', um(f.rvkUm)]);
  } else {
    list.push(['finish', 'Bore finish', 'not measured']);
  }
  if (input.crosshatch?.mode === 'measured') {
    list.push(['crosshatch', 'Crosshatch', `measured ${numberToText(input.crosshatch.includedAngleDeg)}°`]);
  } else if (input.crosshatch?.mode === 'settings') {
    const c = input.crosshatch;
    list.push(['crosshatch', 'Crosshatch', `from hone settings: ${numberToText(c.spindleRpm)} rev/min, stroke ${len(c.strokeLength)}, ${numberToText(c.cyclesPerMinute)} strokes/min`]);
  } else {
    list.push(['crosshatch', 'Crosshatch', 'not measured']);
  }
  // Each section's readings as typed (the deck's straightedge is in its own line above), and each operation's verdict below.
  for (const [path, text] of Object.entries(fieldsFromInput({ sections: input.sections, deck: input.deck && { heights: input.deck.heights } }))) {
    if (path.startsWith('rows.')) continue;
    const words = sectionPathWords(path) ?? path;
    list.push([path, words.charAt(0).toUpperCase() + words.slice(1), text]);
  }
  list.push(['signed', 'Signed off by', input.signedOffBy], ['notes', 'Notes', input.notes || '—']);

  // Worked-out figures.
  results.bores?.cylinders.forEach((cylinder, i) => {
    list.push([`f${i}.taper`, `Cylinder ${i + 1} taper (worked out)`, formatLength(cylinder.taper, unit)]);
    list.push([`f${i}.oor`, `Cylinder ${i + 1} out-of-round (worked out)`, formatLength(cylinder.outOfRound, unit)]);
    if (cylinder.clearance !== undefined) list.push([`f${i}.clearance`, `Cylinder ${i + 1} clearance (worked out)`, formatLength(cylinder.clearance, unit)]);
  });
  if (results.deck) list.push(['f.deck', 'Deck out-of-flat (worked out)', formatLength(results.deck.outOfFlat, unit)]);
  if (results.finish) list.push(['f.ra', 'Bore Ra', `${formatNumber(results.finish.raUm, 2)} µm`]);
  if (results.crosshatch) list.push(['f.angle', 'Crosshatch included angle', `${formatNumber(results.crosshatch.includedAngleDeg, 1)}°`]);
  for (const section of results.sections ?? []) list.push([`f.section.${section.operation}`, `${section.name} (judged)`, SECTION_VERDICT_WORDS[section.verdict]]);
  list.push(['f.result', 'Overall result', judgedNothing(results) ? NOTHING_JUDGED_WORDS : RECORD_VERDICT_WORDS[recordVerdict(results)]]);
  return list;
}

/** Every reading, condition and figure that differs from the version before, in the record's order. */
export function versionChanges(previous: InspectionVersion, next: InspectionVersion): VersionChange[] {
  const before = new Map(entries(previous).map(([key, what, text]) => [key, { what, text }]));
  const after = entries(next);
  const changes: VersionChange[] = [];
  const seen = new Set<string>();
  for (const [key, what, text] of after) {
    seen.add(key);
    const old = before.get(key);
    if (!old) changes.push({ key, what, before: '—', after: text });
    else if (old.text !== text) changes.push({ key, what, before: old.text, after: text });
  }
  for (const [key, old] of before) {
    if (!seen.has(key)) changes.push({ key, what: old.what, before: old.text, after: '—' });
  }
  return changes;
}
