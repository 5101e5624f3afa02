/** Formula worker entry (placeholder until the workbench lands). */
export {};
