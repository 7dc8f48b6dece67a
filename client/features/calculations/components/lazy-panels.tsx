import { lazyPanel, MainPartPlaceholder } from '@client/components/lazy-panel';

/**
 * Every calculator card, in a chunk of its own with zod, the request schemas and the calculations
 * (client/components/lazy-panel.tsx): the page's title, guidance caution, list of calculators and unit
 * switch paint first, and the cards follow at once.
 */
export const CalculatorCards = lazyPanel(
  () => import('./calculator-cards').then((m) => m.CalculatorCards),
  <MainPartPlaceholder>Loading the calculators …</MainPartPlaceholder>,
);
