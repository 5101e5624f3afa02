/**
 * A read-only handle on the workbench, at window.covaryWorkbench: for the browser tests, and for anyone curious in
 * the console. It can read cells and the selection; it cannot change anything.
 */
export interface WorkbenchDebugHandle {
  /** True once the functions are loaded and the first calculation is done. */
  ready: boolean;
  /** True while a recalculation is queued or running. */
  busy(): boolean;
  /** The value a cell holds, e.g. value("North!N2"): numbers at full precision, errors as { error, message }. */
  value(address: string): unknown;
  /** What was typed into a cell: a formula's text, or the value as text ("" when empty). */
  entry(address: string): string;
  /** The selected range, with its sheet. */
  selection(): string;
}

declare global {
  interface Window {
    covaryWorkbench?: WorkbenchDebugHandle;
  }
}
