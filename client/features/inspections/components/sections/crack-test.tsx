import { crackTestMethods } from '@shared/schemas/inspection-sections';
import { METHOD_WORDS } from './clean';
import { Choice, OperationSection, Words, type SectionContext } from './section-kit';
import { SectionPhotos } from './section-photos';

/** Crack test: the method, the result, findings and photos. A crack found stops the record (the entry form hides the rest). */
export function CrackTestSection({ ctx }: { ctx: SectionContext }) {
  return (
    <OperationSection ctx={ctx} operation="crack-test" title="Crack test" prefix="sections.crackTest">
      <div className="grid gap-3 sm:grid-cols-2">
        <Choice ctx={ctx} path="sections.crackTest.method" label="Method" options={crackTestMethods.map((m) => ({ value: m, label: METHOD_WORDS[m] }))} />
        <Choice ctx={ctx} path="sections.crackTest.result" label="Result" options={[{ value: 'no-crack', label: 'No crack found' }, { value: 'crack-found', label: 'Crack found' }]} />
      </div>
      <Words ctx={ctx} path="sections.crackTest.findings" label="Findings: where and how long any indication is" />
      <SectionPhotos ctx={ctx} path="sections.crackTest.photoIds" />
    </OperationSection>
  );
}
