/**
 * Loads dist/functions.js the way Excel hosts it: a plain JavaScript context whose only host global is
 * CustomFunctions (associate, Error, ErrorCode). Getters for window, document, self and Office record any touch.
 */
import * as fs from 'fs';
import * as path from 'path';
import * as vm from 'vm';

export class HostError {
  code: string;
  message: string;
  constructor(code: string, message?: string) {
    this.code = code;
    this.message = message ?? '';
  }
}

export const ErrorCode = {
  invalidValue: '#VALUE!',
  notAvailable: '#N/A',
  divisionByZero: '#DIV/0!',
  invalidNumber: '#NUM!',
  nullReference: '#NULL!',
};

export interface BareHost {
  fns: Map<string, (...args: unknown[]) => unknown>;
  touched: string[];
  HostError: typeof HostError;
}

export function loadBundle(file = path.resolve(__dirname, '../../dist/functions.js')): BareHost {
  const source = fs.readFileSync(file, 'utf8');
  const fns = new Map<string, (...args: unknown[]) => unknown>();
  const touched: string[] = [];
  const context: Record<string, unknown> = {
    CustomFunctions: {
      associate: (id: string, fn: (...args: unknown[]) => unknown) => fns.set(id, fn),
      Error: HostError,
      ErrorCode,
    },
  };
  for (const name of ['window', 'document', 'self', 'Office', 'Excel', 'navigator', 'location', 'fetch', 'XMLHttpRequest']) {
    Object.defineProperty(context, name, {
      get() {
        touched.push(name);
        return undefined;
      },
      enumerable: false,
    });
  }
  vm.createContext(context);
  vm.runInContext(source, context, { filename: 'functions.js' });
  return { fns, touched, HostError };
}

export function distFile(name: string): string {
  return path.resolve(__dirname, '../../dist', name);
}
