import { lazyPanel } from '@client/components/lazy-panel';

// Panels of the dispute case that load when first shown, each in its own chunk (client/components/lazy-panel.tsx):
// the evidence reads the inspection record's judges, the resolution form react-hook-form.
export const EvidenceTimeline = lazyPanel(() => import('./evidence-timeline').then((m) => m.EvidenceTimeline));
export const ResolveDisputeForm = lazyPanel(() => import('./resolve-dispute-form').then((m) => m.ResolveDisputeForm));
