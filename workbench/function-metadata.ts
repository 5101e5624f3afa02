/**
 * The functions' metadata as the build writes it to dist/functions.json (from the functions' JSDoc). The workbench
 * reads it, as Excel does, to know each parameter's type and shape and whether a function wants the addresses of
 * its arguments.
 */

export interface ParameterMeta {
  name: string;
  description?: string;
  type?: string;
  dimensionality?: 'scalar' | 'matrix';
  optional?: boolean;
  repeating?: boolean;
}

export interface FunctionMeta {
  id: string;
  name: string;
  description?: string;
  parameters: ParameterMeta[];
  result?: { type?: string; dimensionality?: 'scalar' | 'matrix' };
  options?: {
    requiresAddress?: boolean;
    requiresParameterAddresses?: boolean;
    stream?: boolean;
    volatile?: boolean;
    cancelable?: boolean;
  };
}

/** The namespace the manifest gives the functions: cells call COVARY.<NAME>. */
export const FUNCTION_NAMESPACE = 'COVARY';

/** Loads functions.json from beside the page; an empty list when it cannot be read. */
export async function loadFunctionMetadata(url = 'functions.json'): Promise<Map<string, FunctionMeta>> {
  const byName = new Map<string, FunctionMeta>();
  try {
    const response = await fetch(url, { cache: 'no-store' });
    if (!response.ok) return byName;
    const json = (await response.json()) as { functions?: FunctionMeta[] };
    for (const f of json.functions ?? []) byName.set(f.name.toUpperCase(), f);
  } catch {
    // The page still works without formulas; cells that use them will show #NAME?.
  }
  return byName;
}
