/** Task pane entry (placeholder until the panel lands). */
export {};
