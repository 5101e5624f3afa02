/** Cell functions: filled in by its module's work. */
export {};
