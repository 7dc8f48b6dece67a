import { cleanMethodsFor } from '@shared/schemas/values';
import { PartCheckSection } from './part-check';
import type { SectionContext } from './section-kit';

export const METHOD_WORDS: Record<string, string> = {
  'hot-tank': 'Hot tank (caustic: iron and steel only)',
  'thermal-oven': 'Thermal oven',
  'spray-wash': 'Spray wash',
  other: 'Other',
  'magnetic-particle': 'Magnetic particle',
  'dye-penetrant': 'Dye penetrant',
  'pressure-test': 'Pressure test',
};

/** Clean: the method (those suited to the job's metal: no caustic hot tank for aluminium), whether it came out clean, findings and photos. */
export function CleanSection({ ctx }: { ctx: SectionContext }) {
  return (
    <PartCheckSection
      ctx={ctx}
      operation="clean"
      title="Clean"
      inputKey="clean"
      methods={cleanMethodsFor(ctx.job.blockMaterial).map((m) => ({ value: m, label: METHOD_WORDS[m] }))}
      results={[
        { value: 'clean', label: 'Clean' },
        { value: 'residue-left', label: 'Residue left' },
      ]}
      findingsLabel="Findings (optional)"
    />
  );
}
