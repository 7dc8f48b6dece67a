import { crackTestMethods } from '@shared/schemas/values';
import { METHOD_WORDS } from './clean';
import { PartCheckSection } from './part-check';
import type { SectionContext } from './section-kit';

/** Crack test: the method, the result, findings and photos. A crack found stops the record (the entry form hides the rest). */
export function CrackTestSection({ ctx }: { ctx: SectionContext }) {
  return (
    <PartCheckSection
      ctx={ctx}
      operation="crack-test"
      title="Crack test"
      inputKey="crackTest"
      methods={crackTestMethods.map((m) => ({ value: m, label: METHOD_WORDS[m] }))}
      results={[
        { value: 'no-crack', label: 'No crack found' },
        { value: 'crack-found', label: 'Crack found' },
      ]}
      findingsLabel="Findings: where and how long any indication is"
    />
  );
}
