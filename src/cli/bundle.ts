/**
 * The built add-in functions (dist/functions.js) loaded the way a
 * custom-functions host loads them: a bare vm context whose only global is a
 * `CustomFunctions` shim. The CLI therefore computes what Excel computes —
 * the same wrappers, the same argument handling, the same errors.
 */
import * as fs from "fs";
import * as path from "path";
import * as vm from "vm";

/** An error a function raised with `new CustomFunctions.Error(code, message)`. */
export class HostError extends Error {
  constructor(
    readonly code: string,
    message?: string,
  ) {
    super(message ?? "");
  }
}

/** The error codes of CustomFunctions.ErrorCode, as the cell shows them. */
const ERROR_CODES = {
  invalidValue: "#VALUE!",
  notAvailable: "#N/A",
  divisionByZero: "#DIV/0!",
  invalidNumber: "#NUM!",
  nullReference: "#NULL!",
  invalidName: "#NAME?",
  invalidReference: "#REF!",
} as const;

export interface ParameterInfo {
  name: string;
  type: string; // "number" | "string" | "boolean" | "any"
  matrix: boolean;
  optional: boolean;
}

export interface AirtallyFunction {
  id: string;
  fn: (...args: unknown[]) => unknown;
  parameters: ParameterInfo[];
  /** Returns a two-dimensional array that spills. */
  matrix: boolean;
  description: string;
}

interface MetadataFile {
  functions: { id: string; description?: string; parameters?: { name: string; type?: string; dimensionality?: string; optional?: boolean }[]; result?: { dimensionality?: string } }[];
}

export const DEFAULT_DIST = path.resolve(__dirname, "../../dist");

/** Load functions.js and functions.json from a dist folder. Throws a plain Error (with the path) when absent. */
export function loadAirtally(distDir: string = DEFAULT_DIST): Map<string, AirtallyFunction> {
  const codeFile = path.join(distDir, "functions.js");
  const metaFile = path.join(distDir, "functions.json");
  if (!fs.existsSync(codeFile) || !fs.existsSync(metaFile)) {
    throw new Error(`the built add-in is missing (${codeFile}); run \`npm run build\` first`);
  }
  const registered = new Map<string, (...args: unknown[]) => unknown>();
  const CustomFunctions = {
    associate(id: string, fn: (...args: unknown[]) => unknown) {
      registered.set(id.toUpperCase(), fn);
    },
    Error: HostError,
    ErrorCode: ERROR_CODES,
  };
  vm.runInContext(fs.readFileSync(codeFile, "utf8"), vm.createContext({ CustomFunctions }), { filename: codeFile });
  const metadata = JSON.parse(fs.readFileSync(metaFile, "utf8")) as MetadataFile;
  const out = new Map<string, AirtallyFunction>();
  for (const entry of metadata.functions) {
    const id = entry.id.toUpperCase();
    const fn = registered.get(id);
    if (!fn) continue;
    out.set(id, {
      id,
      fn,
      description: entry.description ?? "",
      matrix: entry.result?.dimensionality === "matrix",
      parameters: (entry.parameters ?? []).map((p) => ({ name: p.name, type: p.type ?? "any", matrix: p.dimensionality === "matrix", optional: !!p.optional })),
    });
  }
  return out;
}
