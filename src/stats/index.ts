/** Public surface of the statistics core. */
export * from './types';
