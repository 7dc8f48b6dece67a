/**
 * One ordered operation's part of a judged record: its name and verdict, its
 * figures, its checks (value, allowed, verdict, note), what could not be
 * judged and its statements. Used live on the entry page, in the builder's
 * review and on the certificate page.
 */
import { SECTION_VERDICT_WORDS, checkValueText, figureText, sectionParts } from '@shared/inspection-words';
import type { InspectionResults } from '@shared/schemas/inspection';
import { checkVerdict } from '@shared/schemas/values';
import type { SectionResult, SectionVerdict } from '@shared/schemas/inspection-sections';
import { TableHead } from '@client/components/ui/table-head';
import { cn } from '@client/lib/cn';
import { VerdictMark } from './record-judgement';

const SECTION_LOOK: Record<SectionVerdict, string> = {
  conforms: 'bg-pass-soft text-pass ring-pass/30',
  fails: 'bg-fail-soft text-fail ring-fail/30',
  'not-proven': 'bg-caution-soft text-caution ring-caution/30',
  'not-judged': 'bg-caution-soft text-caution ring-caution/30',
  recorded: 'bg-slate-100 text-slate-700 ring-slate-300',
};

export function SectionVerdictBadge({ verdict }: { verdict: SectionVerdict }) {
  return <span className={cn('inline-flex rounded-full px-2.5 py-0.5 text-sm font-bold ring-1', SECTION_LOOK[verdict])}>{SECTION_VERDICT_WORDS[verdict]}</span>;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

export function RecordSectionBlock({ section, results, headingLevel = 3, showChecks = true }: { section: SectionResult; results: InspectionResults; headingLevel?: 3 | 4; showChecks?: boolean }) {
  const { checks, notJudged } = sectionParts(section, results);
  const Heading = headingLevel === 3 ? 'h3' : 'h4';
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-slate-200 bg-white p-3" data-testid={`record-section-${section.operation}`} data-verdict={section.verdict}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <Heading className="text-base font-bold text-ink">{section.name}</Heading>
        <SectionVerdictBadge verdict={section.verdict} />
      </div>
      {section.figures.length > 0 && (
        <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-2">
          {section.figures.map((figure) => (
            <div key={figure.label} className="flex justify-between gap-2 border-b border-slate-100 py-0.5">
              <dt className="text-ink-soft">{figure.label}</dt>
              <dd className="text-right font-semibold tabular-nums">{figureText(figure)}</dd>
            </div>
          ))}
        </dl>
      )}
      {showChecks && checks.length > 0 && (
        <div className="relative overflow-x-auto">
          <table className="w-full text-left text-sm">
            <TableHead columns={['Check', 'Value', 'Allowed', 'Verdict']} dense />
            <tbody>
              {checks.map((check, i) => (
                <tr key={`${check.what}-${i}`} className="border-t border-slate-100 align-top">
                  <td className="py-1 pr-2">
                    {capitalise(check.what)}
                    {check.note && <span className="block text-ink-soft">{check.note}</span>}
                  </td>
                  <td className="whitespace-nowrap py-1 pr-2 tabular-nums">{checkValueText(check)}</td>
                  <td className="whitespace-nowrap py-1 pr-2 tabular-nums">{check.allowed}</td>
                  <td className="py-1">
                    <VerdictMark verdict={checkVerdict(check)} compact />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {notJudged.length > 0 && (
        <ul className="list-disc pl-5 text-sm text-caution">
          {notJudged.map((item) => (
            <li key={item.what}>
              Not judged: {item.what}, because {item.why}.
            </li>
          ))}
        </ul>
      )}
      {section.statements.map((statement) => (
        <p key={statement} className="text-sm text-ink-soft">
          {statement}
        </p>
      ))}
    </section>
  );
}

/** Every section of a judged record, one block each; nothing for records stored before sections. */
export function RecordSections({ results, headingLevel = 3 }: { results: InspectionResults; headingLevel?: 3 | 4 }) {
  if (!results.sections?.length) return null;
  return (
    <div className="flex flex-col gap-3" data-testid="record-sections">
      {results.sections.map((section) => (
        <RecordSectionBlock key={section.operation} section={section} results={results} headingLevel={headingLevel} />
      ))}
    </div>
  );
}
