// The admin feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { useAuditLog } from './api/admin-audit';
export { useDisputeCase, useDisputeQueue } from './api/admin-disputes';
export type { DisputeQueueStatus } from './api/admin-disputes';
export { ledgerCsvUrl, useLedger } from './api/admin-ledger';
export type { LedgerFilters } from './api/admin-ledger';
export { usePlatformFee } from './api/admin-settings';
export { useAdminShops } from './api/admin-shops';
export { AddAdminForm } from './components/add-admin-form';
export { AdminOverview } from './components/admin-overview';
export { AdminShopsTable } from './components/admin-shops-table';
export { formatFee, formatMoment, ledgerKindWords } from './components/admin-words';
export { AuditTable } from './components/audit-table';
export { DisputeMoney } from './components/dispute-money';
export { DisputeParties, DisputeStatements } from './components/dispute-parties';
export { DisputeQueueTable, DisputeStatusBadge } from './components/dispute-queue-table';
export { LedgerTable, LedgerTotals } from './components/ledger-table';
export { PeopleTable } from './components/people-table';
export { PlatformFeeForm } from './components/platform-fee-form';
export { DisputeDecision } from './components/dispute-decision';
export { EvidenceTimeline, ResolveDisputeForm } from './components/lazy-panels';
