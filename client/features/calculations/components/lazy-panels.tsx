import { lazyPanel } from '@client/components/lazy-panel';

/**
 * Every calculator card, in a chunk of its own with zod, the request schemas and the calculations
 * (client/components/lazy-panel.tsx): the page's title, guidance caution, list of calculators and unit
 * switch paint first, and the cards follow at once. The placeholder is taller than the screen, so the
 * footer stays out of view and nothing moves when they come.
 */
export const CalculatorCards = lazyPanel(
  () => import('./calculator-cards').then((m) => m.CalculatorCards),
  <p className="min-h-[150vh] text-ink-soft" aria-busy="true">
    Loading the calculators …
  </p>,
);
