/** Workbench entry (placeholder until the workbench lands). */
export {};
