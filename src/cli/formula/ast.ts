/**
 * The parsed form of an Excel formula. References are stored relative to the
 * formula's own cell unless the formula pins them with `$`, so one parsed
 * formula serves every cell of a shared formula (and the parse cache is keyed
 * by the position-independent text).
 */

/** One end of a reference: a row/column number that is absolute (`$A$1`) or an offset from the host cell. */
export interface Coord {
  row: number;
  col: number;
  rowAbs: boolean;
  colAbs: boolean;
}

export type Ast =
  | { kind: "number"; value: number }
  | { kind: "string"; value: string }
  | { kind: "boolean"; value: boolean }
  | { kind: "error"; code: string }
  | { kind: "blank" } // an omitted argument: f(1,,2)
  | { kind: "cell"; sheet?: string; at: Coord }
  /** A1:B9, A:A (whole column: rows 1…max), 1:1 (whole row). */
  | { kind: "area"; sheet?: string; from: Coord; to: Coord }
  | { kind: "name"; sheet?: string; name: string }
  | { kind: "table"; table?: string; items: string[]; columns: string[] }
  | { kind: "call"; name: string; args: Ast[] }
  | { kind: "unary"; op: "-" | "+" | "%"; arg: Ast }
  | { kind: "binary"; op: string; left: Ast; right: Ast }
  /** A run of left-associative operators of one precedence (1+2+3+…), kept flat so a long sum nests nothing. */
  | { kind: "chain"; first: Ast; ops: string[]; rest: Ast[] }
  | { kind: "array"; rows: Ast[][] };

export const MAX_ROW = 1048576;
export const MAX_COL = 16384;
