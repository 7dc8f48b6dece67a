import { cleanMethods } from '@shared/schemas/inspection-sections';
import { Choice, OperationSection, Words, type SectionContext } from './section-kit';
import { SectionPhotos } from './section-photos';

export const METHOD_WORDS: Record<string, string> = {
  'hot-tank': 'Hot tank',
  'thermal-oven': 'Thermal oven',
  'spray-wash': 'Spray wash',
  other: 'Other',
  'magnetic-particle': 'Magnetic particle',
  'dye-penetrant': 'Dye penetrant',
  'pressure-test': 'Pressure test',
};

/** Clean: the method, whether it came out clean, findings and photos. */
export function CleanSection({ ctx }: { ctx: SectionContext }) {
  return (
    <OperationSection ctx={ctx} operation="clean" title="Clean" prefix="sections.clean">
      <div className="grid gap-3 sm:grid-cols-2">
        <Choice ctx={ctx} path="sections.clean.method" label="Method" options={cleanMethods.map((m) => ({ value: m, label: METHOD_WORDS[m] }))} />
        <Choice ctx={ctx} path="sections.clean.result" label="Result" options={[{ value: 'clean', label: 'Clean' }, { value: 'residue-left', label: 'Residue left' }]} />
      </div>
      <Words ctx={ctx} path="sections.clean.findings" label="Findings (optional)" />
      <SectionPhotos ctx={ctx} path="sections.clean.photoIds" />
    </OperationSection>
  );
}
