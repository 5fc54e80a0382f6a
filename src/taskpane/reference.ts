/** The function reference: metadata from functions.json and a search over it. Pure; no DOM. */
export interface FunctionMetadata {
  id?: string;
  name: string;
  description?: string;
  helpUrl?: string;
  parameters?: { name: string; description?: string; optional?: boolean; type?: string; dimensionality?: string }[];
  result?: { dimensionality?: string };
}

/** The signature as the reference shows it: AIRTALLY.NAME(a, [b]). */
export function signature(fn: FunctionMetadata): string {
  const args = (fn.parameters ?? []).map((p) => (p.optional ? `[${p.name}]` : p.name)).join(", ");
  return `AIRTALLY.${fn.name}(${args})`;
}

/** Functions whose name, summary or argument names contain every word of the query (case-insensitive). */
export function searchFunctions(functions: FunctionMetadata[], query: string): FunctionMetadata[] {
  const words = query.toLowerCase().split(/\s+/).filter(Boolean);
  if (!words.length) return functions;
  return functions.filter((fn) => {
    const text = `${fn.name} ${fn.description ?? ""} ${(fn.parameters ?? []).map((p) => `${p.name} ${p.description ?? ""}`).join(" ")}`.toLowerCase();
    return words.every((w) => text.includes(w));
  });
}
