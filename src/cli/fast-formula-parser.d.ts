/** Minimal typings for fast-formula-parser 1.0.x (MIT; the parts Airtally's CLI uses). */
declare module "fast-formula-parser" {
  export interface CellRef { sheet?: string; row: number; col: number }
  export interface RangeRef { sheet?: string; from: { row: number; col: number }; to: { row: number; col: number } }
  export interface Position { sheet: string; row: number; col: number }
  export interface FunctionArg { value: unknown; isArray: boolean; isRangeRef?: boolean; isCellRef?: boolean; omitted?: boolean }
  export class FormulaError extends Error {
    constructor(error: string, msg?: string, details?: unknown);
    readonly error: string;
    details?: unknown;
    static DIV0: FormulaError; static NA: FormulaError; static NAME: FormulaError; static NULL: FormulaError;
    static NUM: FormulaError; static REF: FormulaError; static VALUE: FormulaError;
  }
  export class DepParser {
    constructor(config?: { onVariable?: (name: string, sheet: string) => unknown });
    parse(formula: string, position: Position, ignoreError?: boolean): (CellRef | RangeRef)[];
  }
  interface Config {
    functions?: Record<string, (...args: FunctionArg[]) => unknown>;
    functionsNeedContext?: Record<string, (context: unknown, ...args: FunctionArg[]) => unknown>;
    onVariable?: (name: string, sheet: string) => CellRef | RangeRef | null;
    onCell?: (ref: CellRef) => unknown;
    onRange?: (ref: RangeRef) => unknown[][];
  }
  class FormulaParser {
    constructor(config?: Config, isTest?: boolean);
    parse(formula: string, position: Position, allowReturnArray?: boolean): unknown;
    static FormulaError: typeof FormulaError;
    static DepParser: typeof DepParser;
    static MAX_ROW: number;
    static MAX_COLUMN: number;
  }
  export default FormulaParser;
}
