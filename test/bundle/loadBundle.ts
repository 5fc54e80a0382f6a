/**
 * Loads the built functions bundle the way a custom-functions host sees it:
 * a bare JavaScript context (vm) in which the only global is a stub
 * `CustomFunctions` — no DOM, no Office, no Node modules.
 */
import * as fs from "fs";
import * as path from "path";
import * as vm from "vm";

export const DIST = path.resolve(__dirname, "../../dist");

/** What the stub records of a spreadsheet error. */
export class SpreadsheetError extends Error {
  constructor(
    readonly code: string,
    message?: string,
  ) {
    super(message);
  }
}

export interface LoadedBundle {
  /** Registered functions by id, as the host calls them. */
  readonly functions: Map<string, (...args: unknown[]) => unknown>;
  /** Globals the bundle defined or touched besides CustomFunctions. */
  readonly globalsAfterLoad: string[];
  /** Time to load and register, ms. */
  readonly loadMs: number;
}

export const ERROR_CODES = { invalidValue: "#VALUE!", notAvailable: "#N/A" } as const;

export function loadBundle(file = path.join(DIST, "functions.js")): LoadedBundle {
  const source = fs.readFileSync(file, "utf8");
  const functions = new Map<string, (...args: unknown[]) => unknown>();
  const CustomFunctions = {
    associate(id: string, fn: (...args: unknown[]) => unknown) {
      if (functions.has(id)) throw new Error(`duplicate registration of ${id}`);
      functions.set(id, fn);
    },
    Error: SpreadsheetError,
    ErrorCode: ERROR_CODES,
  };
  const context = vm.createContext({ CustomFunctions });
  const before = new Set(Object.keys(context));
  const start = process.hrtime.bigint();
  vm.runInContext(source, context, { filename: "functions.js" });
  const loadMs = Number(process.hrtime.bigint() - start) / 1e6;
  const globalsAfterLoad = Object.keys(context).filter((k) => !before.has(k));
  return { functions, globalsAfterLoad, loadMs };
}

/** Call a registered function; returns its value or the SpreadsheetError it threw. */
export function call(bundle: LoadedBundle, id: string, ...args: unknown[]): unknown {
  const fn = bundle.functions.get(id);
  if (!fn) throw new Error(`${id} is not registered`);
  try {
    return fn(...args);
  } catch (e) {
    if (e instanceof SpreadsheetError) return e;
    throw e;
  }
}

export function readMetadata(): { functions: { id: string; name: string; parameters: { name: string; optional?: boolean; type?: string }[]; helpUrl?: string; description?: string; result?: { dimensionality?: string } }[]; enums?: unknown[] } {
  return JSON.parse(fs.readFileSync(path.join(DIST, "functions.json"), "utf8"));
}
