import { DebouncedTextField } from './debounced-text-field';

/** "Within N miles (or km)": the radius filter of the board and the directory, kept in the address bar as `within`. */
export function WithinField({ label, value, onCommit }: { label: string; value: string; onCommit: (text: string) => void }) {
  return <DebouncedTextField label={label} inputMode="decimal" value={value} onCommit={onCommit} />;
}
