import { Choice, OperationSection, Words, type SectionContext } from './section-kit';
import { SectionPhotos } from './section-photos';

type Option = { value: string; label: string };

/** A check of a whole part (clean, crack test): the method, the result, findings in words and photos. */
export function PartCheckSection({ ctx, operation, title, inputKey, methods, results, findingsLabel }: { ctx: SectionContext; operation: string; title: string; inputKey: 'clean' | 'crackTest'; methods: Option[]; results: Option[]; findingsLabel: string }) {
  const path = (key: string) => `sections.${inputKey}.${key}`;
  return (
    <OperationSection ctx={ctx} operation={operation} title={title} prefix={`sections.${inputKey}`}>
      <div className="grid gap-3 sm:grid-cols-2">
        <Choice ctx={ctx} path={path('method')} label="Method" options={methods} />
        <Choice ctx={ctx} path={path('result')} label="Result" options={results} />
      </div>
      <Words ctx={ctx} path={path('findings')} label={findingsLabel} />
      <SectionPhotos ctx={ctx} path={path('photoIds')} />
    </OperationSection>
  );
}
