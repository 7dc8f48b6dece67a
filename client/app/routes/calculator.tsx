import { PageTitle } from '@client/components/ui/card';
import { Notice } from '@client/components/ui/notice';
import { CalculatorCards, UnitSwitch, usePageUnit, CALCULATOR_SECTIONS } from '@client/features/calculations';

/**
 * The public calculator page: every calculation of the shared library as a
 * form with live results, worked out in the browser. Loaded as its own chunk
 * from the router; the cards (with zod and the calculations) follow in one more.
 */
export function CalculatorRoute() {
  const [unit, setUnit] = usePageUnit();
  return (
    <div className="flex flex-col gap-6">
      <div>
        <PageTitle
          title="Machining calculator"
          lead="Figures for the bench: engine size and compression, bore checks and sizes, honing angle, deck flatness, surface finish, ring gaps, stack-ups, bearing clearance and balance. Results appear as you type; nothing is sent or saved."
        />
        <Notice tone="caution" title="Guidance, not a specification">
          <p data-testid="guidance-caution">
            The figures are guidance. Engine and piston makers&apos; specifications, calibrated instruments, local codes and licensed
            practice govern. Values marked &ldquo;common practice&rdquo; are shop habits, not published limits.
          </p>
        </Notice>
      </div>

      <nav aria-label="Calculators on this page">
        <ul className="grid grid-cols-1 gap-2 sm:grid-cols-2 lg:grid-cols-4">
          {CALCULATOR_SECTIONS.map((section) => (
            <li key={section.id}>
              <a
                href={`#${section.id}`}
                className="flex h-full flex-col rounded-lg bg-paper-raised px-3 py-2 ring-1 ring-slate-200 hover:bg-white hover:ring-slate-400"
              >
                <span className="font-semibold text-slate-700 underline-offset-4 hover:underline">{section.title}</span>
                <span className="text-sm text-ink-soft">{section.blurb}</span>
              </a>
            </li>
          ))}
        </ul>
      </nav>

      <UnitSwitch unit={unit} onChange={setUnit} />

      <CalculatorCards unit={unit} />
    </div>
  );
}
