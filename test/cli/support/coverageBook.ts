/**
 * The coverage workbook of issue 14: every function of the supported list in
 * its plain and its stored (`_xlfn.`/`_xlpm.`) form, boundary cases of every
 * rounding function, an error inside every aggregate, names of both scopes, a
 * table with structured references, whole-column, cross-sheet and absolute
 * references, percentages, array arithmetic and dynamic-array spills.
 *
 * Each case is one formula on sheet Cases (column B, row of its own). The
 * reference engine is LibreOffice Calc; where the Debian release lacks a
 * function (XLOOKUP, LET, SEQUENCE, FILTER, UNIQUE, SORT arrived after 7.4)
 * the case carries a `twin`: a formula of older functions that Excel's
 * documentation defines as the same result, which LibreOffice computes in
 * column H of the same rows (array formulas). Every formula is stored with a
 * wrong cached value (-999999) so a value that survives is caught as not
 * recomputed.
 */
import type { FixtureBook, FixtureCell } from "./writeXlsx";
import { columnLetters } from "../../../src/cli/address";

export interface CoverageCase {
  id: string;
  formula: string;
  /** LibreOffice-side formula (one array formula over the spill, or one per cell, row-major). */
  twin?: string | string[];
  /** Rows × columns the result spills into (default 1 × 1). */
  spill?: [number, number];
  /**
   * Where LibreOffice and the spreadsheet host's function reference disagree,
   * airtally follows the reference (`excel`, from memory of the documented
   * result) and the test checks that LibreOffice still gives `libreOffice`.
   */
  divergence?: { excel: string; libreOffice: string; why: string };
}

export const WRONG_CACHE = -999999;
export const CASES_SHEET = "Cases";
export const FIRST_CASE_ROW = 2;
/** Column of our formula and of the LibreOffice-side formula. */
export const OURS_COL = 2;
export const THEIRS_COL = 8;

const D = "Data!";
const lookupTwin = (key: string, within: string, ret: string) => `INDEX(${ret},MATCH(${key},${within},0))`;

export const CASES: CoverageCase[] = [
  // Aggregates and their *IF(S) forms
  { id: "SUM", formula: `SUM(${D}C2:C6)` },
  { id: "SUM args", formula: `SUM(${D}C2,${D}C3,5,TRUE)` },
  { id: "SUMIF", formula: `SUMIF(${D}A2:A6,"a",${D}C2:C6)` },
  { id: "SUMIF wildcard", formula: `SUMIF(${D}A2:A6,"b*",${D}C2:C6)` },
  { id: "SUMIF >", formula: `SUMIF(${D}C2:C6,">500")` },
  { id: "SUMIFS", formula: `SUMIFS(${D}C2:C6,${D}A2:A6,"a",${D}D2:D6,">2")` },
  { id: "COUNTIF", formula: `COUNTIF(${D}A2:A6,"a")` },
  { id: "COUNTIF <>", formula: `COUNTIF(${D}A2:A6,"<>a")` },
  { id: "COUNTIF blank", formula: `COUNTIF(${D}G2:G8,"")` },
  { id: "COUNTIF number text", formula: `COUNTIF(${D}C2:C6,"640")` },
  { id: "COUNTIFS", formula: `COUNTIFS(${D}A2:A6,"a",${D}C2:C6,"<1000")` },
  { id: "AVERAGE", formula: `AVERAGE(${D}C2:C6)` },
  { id: "AVERAGEIF", formula: `AVERAGEIF(${D}A2:A6,"a",${D}C2:C6)` },
  { id: "AVERAGEIF none", formula: `AVERAGEIF(${D}A2:A6,"zz",${D}C2:C6)` },
  { id: "AVERAGEIFS", formula: `AVERAGEIFS(${D}C2:C6,${D}B2:B6,"north")` },
  { id: "MAX", formula: `MAX(${D}C2:C6)` },
  { id: "MIN", formula: `MIN(${D}C2:C6,100)` },
  { id: "MAXIFS stored", formula: `_xlfn.MAXIFS(${D}C2:C6,${D}A2:A6,"a")` },
  { id: "MAXIFS plain", formula: `MAXIFS(${D}C2:C6,${D}A2:A6,"a")`, twin: `_xlfn.MAXIFS(${D}C2:C6,${D}A2:A6,"a")` },
  { id: "MINIFS stored", formula: `_xlfn.MINIFS(${D}C2:C6,${D}B2:B6,"north")` },
  { id: "MINIFS plain", formula: `MINIFS(${D}C2:C6,${D}B2:B6,"north")`, twin: `_xlfn.MINIFS(${D}C2:C6,${D}B2:B6,"north")` },
  { id: "COUNT", formula: `COUNT(${D}C2:E6)` },
  { id: "COUNTA", formula: `COUNTA(${D}A1:A8)` },
  // SUMPRODUCT and array arithmetic
  { id: "SUMPRODUCT condition", formula: `SUMPRODUCT((${D}A2:A4="a")*${D}C2:C4)` },
  { id: "SUMPRODUCT times 1", formula: `SUMPRODUCT(${D}C2:C5*1)` },
  { id: "SUMPRODUCT pair", formula: `SUMPRODUCT(${D}C2:C6,${D}D2:D6)` },
  { id: "SUMPRODUCT --", formula: `SUMPRODUCT(--(${D}C2:C6>200))` },
  { id: "SUMPRODUCT text as 0", formula: `SUMPRODUCT(${D}A2:A3,${D}C2:C3)` },
  { id: "spill arithmetic", formula: `${D}C2:C4*2`, spill: [3, 1], twin: `${D}C2:C4*2` },
  { id: "spill broadcast", formula: `${D}C2:C3*${D}H1:I1`, spill: [2, 2], twin: `${D}C2:C3*${D}H1:I1` },
  // Logic
  { id: "IF", formula: `IF(${D}C2>1000,"big","small")` },
  { id: "IF no else", formula: `IF(${D}C3>1000,"big")` },
  { id: "IFS stored", formula: `_xlfn.IFS(${D}C3>1000,"big",${D}C3>500,"mid",TRUE,"small")` },
  { id: "IFS plain", formula: `IFS(${D}C3>1000,"big",${D}C3>500,"mid",TRUE,"small")`, twin: `_xlfn.IFS(${D}C3>1000,"big",${D}C3>500,"mid",TRUE,"small")` },
  { id: "IFS none", formula: `_xlfn.IFS(FALSE,1)` },
  { id: "IFERROR", formula: `IFERROR(1/0,"none")` },
  { id: "IFERROR value", formula: `IFERROR(${D}C2,"none")` },
  { id: "IFNA stored", formula: `_xlfn.IFNA(${D}E2,"missing")` },
  { id: "IFNA plain", formula: `IFNA(${D}E2,"missing")`, twin: `_xlfn.IFNA(${D}E2,"missing")` },
  { id: "IFNA other error", formula: `_xlfn.IFNA(1/0,"missing")` },
  { id: "SWITCH stored", formula: `_xlfn.SWITCH(${D}D3,1,"one",3,"three","other")` },
  { id: "SWITCH plain", formula: `SWITCH(${D}D3,1,"one",3,"three","other")`, twin: `_xlfn.SWITCH(${D}D3,1,"one",3,"three","other")` },
  { id: "SWITCH default", formula: `_xlfn.SWITCH(9,1,"one","other")` },
  { id: "SWITCH none", formula: `_xlfn.SWITCH(9,1,"one")` },
  { id: "AND", formula: `AND(${D}C2>100,${D}D2:D6)` },
  { id: "OR", formula: `OR(${D}C2>5000,0)` },
  { id: "NOT", formula: `NOT(${D}C2>5000)` },
  // Rounding, with the boundaries
  { id: "ROUNDUP 2,0", formula: "ROUNDUP(2,0)" },
  { id: "ROUNDUP 0,0", formula: "ROUNDUP(0,0)" },
  { id: "ROUNDUP 20,-1", formula: "ROUNDUP(20,-1)" },
  { id: "ROUNDUP 2300/1000", formula: "ROUNDUP(2300/1000,0)" },
  { id: "ROUNDUP 3000/1000", formula: "ROUNDUP(3000/1000,0)" },
  { id: "ROUNDUP -2.1", formula: "ROUNDUP(-2.1,0)" },
  { id: "ROUNDUP 0.1+0.2", formula: "ROUNDUP(0.1+0.2,1)" },
  { id: "ROUNDUP 1.1*3", formula: "ROUNDUP(1.1*3,1)" },
  { id: "ROUNDUP 2.0001", formula: "ROUNDUP(2.0001,0)" },
  { id: "ROUNDUP 1234,-2", formula: "ROUNDUP(1234,-2)" },
  { id: "ROUND 1.005", formula: "ROUND(1.005,2)" },
  { id: "ROUND 2.5", formula: "ROUND(2.5,0)" },
  { id: "ROUND -2.5", formula: "ROUND(-2.5,0)" },
  { id: "ROUND 0.285", formula: "ROUND(0.285,2)" },
  { id: "ROUND 1234.5678,-2", formula: "ROUND(1234.5678,-2)" },
  { id: "ROUND 2.675", formula: "ROUND(2.675,2)" },
  { id: "ROUNDDOWN 2.999", formula: "ROUNDDOWN(2.999,0)" },
  { id: "ROUNDDOWN -2.5", formula: "ROUNDDOWN(-2.5,0)" },
  { id: "ROUNDDOWN 20,-1", formula: "ROUNDDOWN(20,-1)" },
  { id: "ROUNDDOWN 0.3", formula: "ROUNDDOWN(0.1+0.2,1)" },
  { id: "ROUNDDOWN 4.35", formula: "ROUNDDOWN(4.35*100,0)" },
  { id: "CEILING 2.5", formula: "CEILING(2.5,1)" },
  { id: "CEILING 2", formula: "CEILING(2,1)" },
  { id: "CEILING 0", formula: "CEILING(0,1)" },
  { id: "CEILING -2.5,-1", formula: "CEILING(-2.5,-1)" },
  { id: "CEILING 2300/1000", formula: "CEILING(2300/1000,1)" },
  { id: "CEILING 0.3,0.1", formula: "CEILING(0.1+0.2,0.1)" },
  { id: "CEILING.MATH -0.04", formula: "_xlfn.CEILING.MATH(-0.04)" },
  { id: "CEILING.MATH plain", formula: "CEILING.MATH(-0.04)", twin: "_xlfn.CEILING.MATH(-0.04)" },
  { id: "CEILING.MATH -2.5", formula: "_xlfn.CEILING.MATH(-2.5)" },
  { id: "CEILING.MATH -2.5 mode", formula: "_xlfn.CEILING.MATH(-2.5,1,1)" },
  { id: "CEILING.MATH 6,5", formula: "_xlfn.CEILING.MATH(6,5)" },
  { id: "CEILING.MATH 10,5", formula: "_xlfn.CEILING.MATH(10,5)" },
  { id: "FLOOR 2.5", formula: "FLOOR(2.5,1)" },
  { id: "FLOOR 2", formula: "FLOOR(2,1)" },
  { id: "FLOOR -2.5,-1", formula: "FLOOR(-2.5,-1)" },
  { id: "FLOOR 0.3,0.1", formula: "FLOOR(0.1+0.2,0.1)" },
  { id: "MROUND 10,3", formula: "MROUND(10,3)" },
  { id: "MROUND 7.5,5", formula: "MROUND(7.5,5)" },
  { id: "MROUND -10,-3", formula: "MROUND(-10,-3)" },
  { id: "MROUND 15,5", formula: "MROUND(15,5)" },
  { id: "MROUND sign", formula: "MROUND(10,-3)", divergence: { excel: "#NUM!", libreOffice: "9", why: "opposite signs are #NUM! in the reference; LibreOffice rounds" } },
  // Math
  { id: "ABS", formula: "ABS(-3.5)" },
  { id: "LOG10", formula: "LOG10(1000)" },
  { id: "LOG10 0", formula: "LOG10(0)", divergence: { excel: "#NUM!", libreOffice: "#VALUE!", why: "LibreOffice's invalid-argument error (Err:502) is saved as #VALUE!" } },
  { id: "POWER", formula: "POWER(2,10)" },
  { id: "SQRT", formula: "SQRT(2)" },
  { id: "SQRT -1", formula: "SQRT(-1)", divergence: { excel: "#NUM!", libreOffice: "#VALUE!", why: "LibreOffice's invalid-argument error (Err:502) is saved as #VALUE!" } },
  { id: "percent", formula: `50%*${D}C2` },
  { id: "percent literal", formula: "200%" },
  { id: "percent after ref", formula: `${D}C3*10%` },
  { id: "unary and power", formula: "-2^2" },
  { id: "division by zero", formula: "1/0" },
  // Lookups
  { id: "INDEX other sheet", formula: `INDEX(${D}A1:C3,3,2)` },
  { id: "INDEX row vector", formula: `INDEX(${D}H1:L1,4)` },
  { id: "INDEX out of range", formula: `INDEX(${D}A1:C3,9,1)`, divergence: { excel: "#REF!", libreOffice: "#VALUE!", why: "LibreOffice's invalid-argument error (Err:502) is saved as #VALUE!" } },
  { id: "MATCH exact", formula: `MATCH("c",${D}A2:A6,0)` },
  { id: "MATCH approx", formula: `MATCH(35,${D}F2:F6,1)` },
  { id: "MATCH approx default", formula: `MATCH(50,${D}F2:F6)` },
  { id: "MATCH descending", formula: `MATCH(35,${D}J4:J8,-1)` },
  { id: "MATCH wildcard", formula: `MATCH("b?",${D}A2:A6,0)` },
  { id: "MATCH missing", formula: `MATCH("zz",${D}A2:A6,0)` },
  { id: "INDEX/MATCH", formula: `INDEX(${D}C2:C6,MATCH("c",${D}A2:A6,0))` },
  { id: "VLOOKUP exact", formula: `VLOOKUP("c",${D}A2:D6,3,FALSE)` },
  { id: "VLOOKUP approx", formula: `VLOOKUP(35,${D}F2:G6,2)` },
  { id: "VLOOKUP column out", formula: `VLOOKUP("c",${D}A2:D6,9,FALSE)`, divergence: { excel: "#REF!", libreOffice: "#VALUE!", why: "LibreOffice's invalid-argument error (Err:502) is saved as #VALUE!" } },
  { id: "VLOOKUP missing", formula: `VLOOKUP("zz",${D}A2:D6,2,FALSE)` },
  { id: "HLOOKUP", formula: `HLOOKUP(3,${D}H1:L2,2,FALSE)` },
  { id: "XLOOKUP stored", formula: `_xlfn.XLOOKUP("c",${D}A2:A6,${D}C2:C6)`, twin: lookupTwin('"c"', `${D}A2:A6`, `${D}C2:C6`) },
  { id: "XLOOKUP plain", formula: `XLOOKUP("c",${D}A2:A6,${D}C2:C6)`, twin: lookupTwin('"c"', `${D}A2:A6`, `${D}C2:C6`) },
  { id: "XLOOKUP not found", formula: `_xlfn.XLOOKUP("zz",${D}A2:A6,${D}C2:C6,"none")`, twin: `IFERROR(${lookupTwin('"zz"', `${D}A2:A6`, `${D}C2:C6`)},"none")` },
  { id: "XLOOKUP #N/A", formula: `_xlfn.XLOOKUP("zz",${D}A2:A6,${D}C2:C6)`, twin: lookupTwin('"zz"', `${D}A2:A6`, `${D}C2:C6`) },
  { id: "XLOOKUP next smaller", formula: `_xlfn.XLOOKUP(35,${D}F2:F6,${D}G2:G6,,-1)`, twin: `INDEX(${D}G2:G6,MATCH(35,${D}F2:F6,1))` },
  { id: "XLOOKUP last", formula: `_xlfn.XLOOKUP("a",${D}A2:A6,${D}C2:C6,,0,-1)`, twin: `INDEX(${D}C1:C6,SUMPRODUCT(MAX((${D}A2:A6="a")*ROW(${D}A2:A6))))` },
  { id: "XLOOKUP row", formula: `_xlfn.XLOOKUP(3,${D}H1:L1,${D}H2:L2)`, twin: `HLOOKUP(3,${D}H1:L2,2,FALSE)` },
  { id: "CHOOSE", formula: `CHOOSE(2,"a",${D}C3,"c")` },
  { id: "CHOOSE out of range", formula: `CHOOSE(5,"a","b")` },
  // LET
  { id: "LET stored", formula: "_xlfn.LET(_xlpm.x,3,_xlpm.y,_xlpm.x*2,_xlpm.x+_xlpm.y)", twin: "3+3*2" },
  { id: "LET plain", formula: `LET(x,${D}C2,x/10)`, twin: `${D}C2/10` },
  // Text
  { id: "TEXT percent", formula: 'TEXT(0.256,"0.0%")' },
  { id: "TEXT thousands", formula: 'TEXT(1234.5,"#,##0.00")' },
  { id: "TEXT fixed", formula: 'TEXT(3.14159,"0.00")' },
  { id: "VALUE", formula: 'VALUE("1234.5")' },
  { id: "VALUE bad", formula: 'VALUE("abc")' },
  { id: "CONCAT stored", formula: `_xlfn.CONCAT(${D}A2:A4,"-",${D}C2)` },
  { id: "CONCAT plain", formula: `CONCAT(${D}A2:A4,"-",${D}C2)`, twin: `_xlfn.CONCAT(${D}A2:A4,"-",${D}C2)` },
  { id: "TEXTJOIN stored", formula: `_xlfn.TEXTJOIN(", ",TRUE,${D}A2:A8)` },
  { id: "TEXTJOIN plain", formula: `TEXTJOIN("/",FALSE,${D}A5:A7)`, twin: `_xlfn.TEXTJOIN("/",FALSE,${D}A5:A7)` },
  { id: "LEN", formula: 'LEN("Wi-Fi 6E")' },
  { id: "LEFT", formula: 'LEFT("Wi-Fi 6E",5)' },
  { id: "LEFT default", formula: 'LEFT("Wi-Fi")' },
  { id: "RIGHT", formula: 'RIGHT("Wi-Fi 6E",2)' },
  { id: "MID", formula: 'MID("Wi-Fi 6E",4,2)' },
  { id: "UPPER", formula: `UPPER(${D}B2)` },
  { id: "LOWER", formula: 'LOWER("North Hall")' },
  { id: "SUBSTITUTE", formula: 'SUBSTITUTE("a-b-c","-","+")' },
  { id: "SUBSTITUTE nth", formula: 'SUBSTITUTE("a-b-c","-","+",2)' },
  { id: "TRIM", formula: 'TRIM("  a   b  ")' },
  { id: "CHAR", formula: "CHAR(65)&CHAR(97.9)&CHAR(126)" },
  {
    id: "CHAR above 127",
    formula: "CHAR(233)&CHAR(128)",
    divergence: { excel: '"é€"', libreOffice: "\uFFFD\uFFFD", why: "the reference maps CHAR through the Windows character set, Windows-1252 (é, €; from memory of its CHAR page); LibreOffice 7.4 on Linux decodes the byte as UTF-8, where a lone byte over 127 is U+FFFD" },
  },
  { id: "CHAR control", formula: 'LEN(CHAR(27)&"[2J")' },
  { id: "CHAR past 255", formula: "CHAR(256)" },
  { id: "CODE", formula: 'CODE("Wi-Fi")' },
  { id: "UNICHAR", formula: "_xlfn.UNICHAR(8364)&_xlfn.UNICHAR(65)" },
  { id: "UNICODE", formula: '_xlfn.UNICODE("€5")' },
  { id: "REPT", formula: 'REPT("ab",3)&REPT("x",0)' },
  { id: "REPT at the text limit", formula: 'LEN(REPT("a",32767))' },
  { id: "REPT negative", formula: 'REPT("x",-1)' },
  { id: "concatenation", formula: `"n="&${D}C2&"; third="&1/3` },
  { id: "text compare", formula: `${D}A2="A"` },
  // Dates
  { id: "DATE", formula: "DATE(2026,1,31)" },
  { id: "DATE month overflow", formula: "DATE(2026,14,1)" },
  { id: "EDATE", formula: "EDATE(DATE(2026,1,31),1)" },
  { id: "EDATE back", formula: "EDATE(DATE(2024,3,31),-1)" },
  { id: "TODAY", formula: "TODAY()" },
  // Names, tables, whole columns, other sheets, absolute references
  { id: "name workbook scope", formula: "SUM(Rates)" },
  { id: "name constant", formula: "Factor*10" },
  { id: "name sheet scope", formula: "Local*2" },
  { id: "name of other sheet scope", formula: "Data!Local+1" },
  { id: "name formula", formula: "Pair*2" },
  { id: "INDEX of a name", formula: "INDEX(Rates,2)" },
  { id: "whole row", formula: `SUM(${D}2:2)` },
  { id: "two whole columns", formula: `SUM(${D}C:D)` },
  { id: "range to absolute end", formula: `SUM(${D}C2:$C$6)` },
  { id: "table column", formula: "SUM(Sites[Area])" },
  { id: "table calculated column", formula: "SUM(Sites[Days])" },
  // LibreOffice 7.4 does not read a lone item specifier (Sites[#All]) from a file: twins spell the same cells.
  { id: "table all", formula: "COUNTA(Sites[#All])", twin: `COUNTA(${D}N1:P5)` },
  { id: "table headers", formula: "INDEX(Sites[#Headers],1,2)", twin: "INDEX(Sites[[#Headers],[Area]],1,1)" },
  { id: "table headers item", formula: "INDEX(Sites[[#Headers],[Days]],1,1)" },
  { id: "table column range", formula: "COUNTA(Sites[[#All],[Site]:[Area]])" },
  { id: "table bare name", formula: "SUM(Sites)" },
  { id: "table SUMIFS", formula: 'SUMIFS(Sites[Area],Sites[Site],"D*")' },
  { id: "whole column", formula: `SUM(${D}C:C)` },
  { id: "whole column MATCH", formula: `MATCH("c",${D}A:A,0)` },
  { id: "whole column COUNTA", formula: `COUNTA(${D}A:A)` },
  { id: "absolute", formula: `${D}$C$2+${D}C$3+${D}$C4` },
  { id: "quoted sheet", formula: "'My Sheet'!A1*2" },
  { id: "quoted sheet range", formula: "SUM('My Sheet'!A1:A2)" },
  // Errors inside every aggregate
  { id: "error in SUM", formula: `SUM(${D}E2:E3)` },
  { id: "error in SUM 2", formula: `SUM(${D}E3:E5)` },
  { id: "error in AVERAGE", formula: `AVERAGE(${D}E2:E3)` },
  { id: "error in MAX", formula: `MAX(${D}E3:E5)` },
  { id: "error in MIN", formula: `MIN(${D}E2:E3)` },
  { id: "error in SUMPRODUCT", formula: `SUMPRODUCT(${D}E3:E5,${D}C3:C5)` },
  { id: "error in SUMIF", formula: `SUMIF(${D}A3:A5,"a",${D}E3:E5)` },
  { id: "error in SUMIF skipped", formula: `SUMIF(${D}A2:A5,"c",${D}E2:E5)` },
  { id: "error in SUMIFS", formula: `SUMIFS(${D}E2:E3,${D}A2:A3,"a")` },
  { id: "error in AVERAGEIF", formula: `AVERAGEIF(${D}A3:A5,"a",${D}E3:E5)` },
  { id: "error in AVERAGEIFS", formula: `AVERAGEIFS(${D}E2:E3,${D}A2:A3,"a")` },
  { id: "error in MAXIFS", formula: `_xlfn.MAXIFS(${D}E3:E5,${D}A3:A5,"a")` },
  { id: "error in MINIFS", formula: `_xlfn.MINIFS(${D}E2:E3,${D}A2:A3,"a")` },
  { id: "error in COUNTIF", formula: `COUNTIF(${D}E2:E5,">1")` },
  { id: "error in COUNTIFS", formula: `COUNTIFS(${D}E2:E5,">1",${D}A2:A5,"<>x")` },
  { id: "error in COUNT", formula: `COUNT(${D}E2:E5)` },
  { id: "error in COUNTA", formula: `COUNTA(${D}E2:E5)` },
  { id: "error in AND", formula: `AND(${D}E2:E3)` },
  { id: "error in OR", formula: `OR(${D}E3:E5)` },
  { id: "error in CONCAT", formula: `_xlfn.CONCAT(${D}E2:E3)` },
  { id: "error in TEXTJOIN", formula: `_xlfn.TEXTJOIN(",",TRUE,${D}E3:E5)` },
  { id: "error in arithmetic", formula: `${D}E2+1` },
  { id: "error in SUM of cells", formula: `SUM(${D}C2,${D}E4)` },
  // Coercions and comparisons
  {
    id: "SUMPRODUCT of comparisons uncoerced",
    formula: `SUMPRODUCT(${D}C2:C6>200)`,
    divergence: { excel: "0", libreOffice: "3", why: "SUMPRODUCT counts logical values as 0 in the reference (hence the common --); LibreOffice counts TRUE as 1" },
  },
  { id: "SUM of IF array", formula: `SUM(IF(${D}A2:A6="a",${D}C2:C6,0))`, twin: `SUM(IF(${D}A2:A6="a",${D}C2:C6,0))` },
  { id: "text and logical", formula: '"x"&TRUE', divergence: { excel: '"xTRUE"', libreOffice: "x1", why: "a logical value joins text as TRUE in the reference; LibreOffice saves the number 1" } },
  { id: "text order", formula: '"a"<"B"' },
  { id: "number below text", formula: '1<"a"' },
  { id: "blank equals empty text", formula: `${D}A7=""` },
  { id: "blank equals zero", formula: `${D}A7=0` },
  { id: "blank in arithmetic", formula: `${D}A7+1` },
  { id: "numeric text in arithmetic", formula: '"3"+1' },
  { id: "text in arithmetic", formula: '"x"+1' },
  { id: "logical in arithmetic", formula: "TRUE+TRUE" },
  { id: "COUNTIF numeric criterion", formula: `COUNTIF(${D}C2:C6,640)` },
  { id: "COUNTIF >= text", formula: `COUNTIF(${D}A2:A6,">=b")` },
  { id: "SUMIF <>", formula: `SUMIF(${D}A2:A6,"<>a",${D}C2:C6)` },
  { id: "COUNTIF wildcard escape", formula: `COUNTIF(${D}A2:A6,"b~*")` },
  { id: "AVERAGE with logical argument", formula: "AVERAGE(1,TRUE,3)" },
  { id: "COUNTIF blank criterion cell", formula: `COUNTIF(${D}Q2:Q6,${D}Q9)` },
  { id: "COUNTIF zero criterion", formula: `COUNTIF(${D}Q2:Q6,0)` },
  { id: "SUMIF blank criterion cell", formula: `SUMIF(${D}Q2:Q6,${D}Q9,${D}C2:C6)` },
  { id: "COUNTIF TRUE", formula: `COUNTIF(${D}Q2:Q6,TRUE)` },
  { id: "COUNTIF \"TRUE\"", formula: `COUNTIF(${D}Q2:Q6,"TRUE")` },
  { id: "MAX of nothing", formula: `MAX(${D}A2:A6)` },
  { id: "TEXT date", formula: 'TEXT(DATE(2026,3,5),"yyyy-mm-dd")', divergence: { excel: "#VALUE!", libreOffice: "2026-03-05", why: "date and time formats in TEXT are not supported here: an error cell, not a guess" } },
  { id: "TEXT integer", formula: 'TEXT(1234.567,"0")' },
  { id: "TEXT three places", formula: 'TEXT(2.5,"0.000")' },
  { id: "TEXT thousands integer", formula: 'TEXT(1234567,"#,##0")' },
  { id: "TEXT whole percent", formula: 'TEXT(0.125,"0%")' },
  { id: "TEXT with unit", formula: 'TEXT(1234.5,"#,##0.0 ""MB""")' },
  { id: "TEXT negative", formula: 'TEXT(-1234.5,"#,##0.00")' },
  { id: "TEXT currency", formula: 'TEXT(-5.5,"$0.00")' },
  { id: "TEXT text value", formula: 'TEXT("abc","0.0")' },
  { id: "TEXT scientific", formula: 'TEXT(1234.5,"0.0E+00")', divergence: { excel: "#VALUE!", libreOffice: "1.2E+03", why: "scientific formats in TEXT are not supported here: an error cell, not a guess" } },
  { id: "DATE arithmetic", formula: "DATE(2026,3,1)-DATE(2026,2,1)" },
  { id: "ROUND negative digits half", formula: "ROUND(-1250,-2)" },
  { id: "nested functions", formula: `ROUNDUP(SUMIF(${D}A2:A6,"a",${D}C2:C6)/1000,0)*MAX(${D}D2:D6)` },
  { id: "IFERROR over MATCH", formula: `IFERROR(MATCH("zz",${D}A2:A6,0),0)` },
  { id: "INDEX whole column", formula: `SUM(INDEX(${D}C2:D6,0,2))` },
  { id: "INDEX whole row", formula: `SUM(INDEX(${D}C2:D6,2,0))` },
  { id: "VLOOKUP wildcard", formula: `VLOOKUP("b*",${D}A2:C6,3,FALSE)` },
  { id: "MATCH text approx", formula: `MATCH("t35",${D}G2:G6,1)` },
  { id: "exponent", formula: "2^0.5*10" },
  { id: "scientific literal", formula: "1.5E3+2e-1" },
  // More edges: lookups, text, numbers in text, shapes
  { id: "MATCH logical", formula: `MATCH(TRUE,${D}Q2:Q6,0)` },
  { id: "XLOOKUP wildcard mode", formula: `_xlfn.XLOOKUP("b*",${D}A2:A6,${D}C2:C6,,2)`, twin: `INDEX(${D}C2:C6,MATCH("b*",${D}A2:A6,0))` },
  { id: "SWITCH text case", formula: '_xlfn.SWITCH("North","north",1,2)' },
  { id: "IFS error condition", formula: "_xlfn.IFS(1/0,1,TRUE,2)" },
  { id: "OR of text only", formula: `OR(${D}A2:A3)` },
  { id: "ROUND of numeric text", formula: 'ROUND("2.5",0)' },
  { id: "LEFT of number", formula: "LEFT(12345,2)" },
  { id: "LEN of number", formula: "LEN(1/4)" },
  { id: "MID past the end", formula: 'MID("abc",3,10)' },
  { id: "SUBSTITUTE case", formula: 'SUBSTITUTE("aAa","a","x")' },
  { id: "UPPER of logical", formula: "UPPER(TRUE)", divergence: { excel: '"TRUE"', libreOffice: "1", why: "a logical value becomes the text TRUE in the reference; LibreOffice saves the number 1" } },
  { id: "CONCAT of a third", formula: "_xlfn.CONCAT(1/3,2)" },
  { id: "EDATE fractional months", formula: "EDATE(DATE(2026,1,15),1.9)" },
  { id: "VALUE percent", formula: 'VALUE("12%")' },
  { id: "VALUE thousands", formula: 'VALUE(" 1,234 ")' },
  { id: "INDEX array constant", formula: "INDEX({1,2;3,4},2,1)" },
  { id: "SUM of CHOOSE range", formula: `SUM(CHOOSE(2,${D}C2:C3,${D}D2:D3))` },
  { id: "big number to text", formula: '"n"&1E+20', divergence: { excel: '"n1E+20"', libreOffice: "n1E+020", why: "LibreOffice writes three exponent digits, the reference two" } },
  { id: "tiny number to text", formula: '"n"&1E-20', divergence: { excel: '"n1E-20"', libreOffice: "n1E-020", why: "LibreOffice writes three exponent digits, the reference two" } },
  { id: "small number to text", formula: '"n"&0.0000001' },
  { id: "small number to text 2", formula: '"n"&-1.25E-8' },
  { id: "16-digit integer to text", formula: '"n"&1234567890123456' },
  { id: "long fraction to text", formula: '"n"&2/3*1E10' },
  { id: "SQRT of text", formula: 'SQRT("x")' },
  { id: "blank divided", formula: `${D}A7/4` },
  { id: "MAXIFS no match", formula: `_xlfn.MAXIFS(${D}C2:C6,${D}A2:A6,"zz")` },
  { id: "AVERAGEIFS no match", formula: `AVERAGEIFS(${D}C2:C6,${D}A2:A6,"zz")` },
  { id: "COUNTIFS shapes differ", formula: `COUNTIFS(${D}A2:A6,"a",${D}C2:C5,">1")` },
  { id: "SUMPRODUCT shapes differ", formula: `SUMPRODUCT(${D}C2:C6,${D}D2:D5)` },
  { id: "MMULT", formula: `SUM(MMULT(${D}C2:D3,${D}H1:I2*0+1))`, twin: `SUM(MMULT(${D}C2:D3,${D}H1:I2*0+1))` },
  { id: "percent text", formula: '"50%"+0' },
  { id: "IF array in SUMPRODUCT", formula: `SUMPRODUCT(IF(${D}C2:C6>500,1,0))`, twin: `SUMPRODUCT(IF(${D}C2:C6>500,1,0))` },
  { id: "TRANSPOSE spill", formula: `TRANSPOSE(${D}C2:C4)`, spill: [1, 3], twin: `TRANSPOSE(${D}C2:C4)` },
  { id: "ROUND big digits", formula: "ROUND(1/3,20)" },
  { id: "ROUNDUP tiny", formula: "ROUNDUP(1E-20,2)" },
  { id: "FLOOR.MATH", formula: "_xlfn.FLOOR.MATH(-2.5)" },
  { id: "CEILING different signs", formula: "CEILING(2.5,-1)", divergence: { excel: "#NUM!", libreOffice: "#VALUE!", why: "LibreOffice's invalid-argument error (Err:502) is saved as #VALUE!" } },
  // Dynamic arrays (LibreOffice 7.4 lacks these functions: twins of older ones)
  { id: "SEQUENCE stored", formula: "_xlfn.SEQUENCE(3,2,10,5)", spill: [3, 2], twin: "10+5*((ROW($A$1:$B$3)-1)*2+COLUMN($A$1:$B$3)-1)" },
  { id: "SEQUENCE plain", formula: "SEQUENCE(3)", spill: [3, 1], twin: "ROW($A$1:$A$3)" },
  {
    id: "FILTER stored",
    formula: `_xlfn._xlws.FILTER(${D}A2:A6,${D}C2:C6>500)`,
    spill: [3, 1],
    twin: [1, 2, 3].map((k) => `INDEX(${D}A2:A6,SMALL(IF(${D}C2:C6>500,ROW(${D}C2:C6)-ROW(${D}C2)+1),${k}))`),
  },
  {
    id: "FILTER plain",
    formula: `FILTER(${D}C2:C6,${D}A2:A6="a")`,
    spill: [2, 1],
    twin: [1, 2].map((k) => `INDEX(${D}C2:C6,SMALL(IF(${D}A2:A6="a",ROW(${D}A2:A6)-ROW(${D}A2)+1),${k}))`),
  },
  { id: "FILTER empty", formula: `_xlfn._xlws.FILTER(${D}C2:C6,${D}C2:C6>99999,"none")`, twin: `IF(COUNTIF(${D}C2:C6,">99999")=0,"none",0)` },
  {
    id: "UNIQUE stored",
    formula: `_xlfn.UNIQUE(${D}A2:A6)`,
    spill: [4, 1],
    twin: [1, 2, 3, 4].map((k) => `INDEX(${D}A2:A6,SMALL(IF(MATCH(${D}A2:A6,${D}A2:A6,0)=ROW(${D}A2:A6)-ROW(${D}A2)+1,ROW(${D}A2:A6)-ROW(${D}A2)+1),${k}))`),
  },
  {
    id: "UNIQUE plain",
    formula: `UNIQUE(${D}B2:B6)`,
    spill: [4, 1],
    twin: [1, 2, 3, 4].map((k) => `INDEX(${D}B2:B6,SMALL(IF(MATCH(${D}B2:B6,${D}B2:B6,0)=ROW(${D}B2:B6)-ROW(${D}B2)+1,ROW(${D}B2:B6)-ROW(${D}B2)+1),${k}))`),
  },
  { id: "SORT stored", formula: `_xlfn._xlws.SORT(${D}C2:C6)`, spill: [5, 1], twin: [1, 2, 3, 4, 5].map((k) => `SMALL(${D}C2:C6,${k})`) },
  { id: "SORT descending", formula: `SORT(${D}C2:C6,1,-1)`, spill: [5, 1], twin: [1, 2, 3, 4, 5].map((k) => `LARGE(${D}C2:C6,${k})`) },
  { id: "SUM of SEQUENCE", formula: "SUM(_xlfn.SEQUENCE(10))", twin: "SUMPRODUCT(ROW($A$1:$A$10))" },
];

const cell = (ref: string, v: number | string | boolean): FixtureCell => ({ ref, value: v });

/** Data, a second sheet with a space in its name, and the cases. */
export function coverageBook(): FixtureBook {
  const data: FixtureCell[] = [
    cell("A1", "name"), cell("B1", "zone"), cell("C1", "n"), cell("D1", "w"), cell("E1", "err"), cell("F1", "step"), cell("G1", "label"),
    cell("A2", "a"), cell("B2", "north"), cell("C2", 1290), cell("D2", 2), { ref: "E2", error: "#N/A" }, cell("F2", 10), cell("G2", "t10"),
    cell("A3", "b"), cell("B3", "south"), cell("C3", 640), cell("D3", 3), cell("E3", 5), cell("F3", 20), cell("G3", "t20"),
    cell("A4", "a"), cell("B4", "east"), cell("C4", 145), cell("D4", 4), { ref: "E4", formula: "1/0", cached: WRONG_CACHE }, cell("F4", 30), cell("G4", "t30"),
    cell("A5", "c"), cell("B5", "west"), cell("C5", 90), cell("D5", 5), cell("E5", 7), cell("F5", 40), cell("G5", "t40"),
    cell("A6", "bb"), cell("B6", "north"), cell("C6", 2300), cell("D6", 1), cell("F6", 50), cell("G6", "t50"),
    cell("A8", "z"),
    // a mixed column for criteria: 0, blank (Q3), text, TRUE, 5
    cell("Q2", 0), cell("Q4", "x"), cell("Q5", true), cell("Q6", 5),
    // a horizontal lookup table and a descending list
    ...[1, 2, 3, 4, 5].flatMap((k) => [cell(`${columnLetters(7 + k)}1`, k), cell(`${columnLetters(7 + k)}2`, `h${k}`)]),
    ...[50, 40, 30, 20, 10].map((v, i) => cell(`J${4 + i}`, v)),
    // table Sites (N1:P5) with a calculated column
    cell("N1", "Site"), cell("O1", "Area"), cell("P1", "Days"),
    ...[["Lobby", 2300], ["Hall", 1800], ["Deck", 950], ["Dock", 4100]].flatMap(([s, a], i) => [
      cell(`N${2 + i}`, s as string),
      cell(`O${2 + i}`, a as number),
      { ref: `P${2 + i}`, formula: "ROUNDUP(Sites[[#This Row],[Area]]/1000,0)", cached: WRONG_CACHE },
    ]),
  ];
  const cases: FixtureCell[] = [cell("A1", "case"), cell("B1", "airtally"), cell(`${columnLetters(THEIRS_COL)}1`, "reference")];
  let row = FIRST_CASE_ROW;
  for (const c of CASES) {
    const [h, w] = c.spill ?? [1, 1];
    cases.push(cell(`A${row}`, c.id));
    cases.push({ ref: `${columnLetters(OURS_COL)}${row}`, formula: c.formula, cached: WRONG_CACHE });
    if (c.twin !== undefined) {
      if (typeof c.twin === "string") {
        const area = `${columnLetters(THEIRS_COL)}${row}:${columnLetters(THEIRS_COL + w - 1)}${row + h - 1}`;
        cases.push({ ref: `${columnLetters(THEIRS_COL)}${row}`, formula: c.twin, array: area, cached: WRONG_CACHE });
      } else
        c.twin.forEach((f, k) => {
          const ref = `${columnLetters(THEIRS_COL + (k % w))}${row + Math.floor(k / w)}`;
          cases.push({ ref, formula: f, array: `${ref}:${ref}`, cached: WRONG_CACHE });
        });
    }
    row += h + (c.spill ? 1 : 0);
  }
  return {
    sheets: [
      { name: "Data", cells: data, tables: [{ name: "Sites", ref: "N1:P5", columns: ["Site", "Area", "Days"] }] },
      { name: CASES_SHEET, cells: cases },
      { name: "My Sheet", cells: [cell("A1", 42), cell("A2", 8)] },
    ],
    names: [
      { name: "Rates", text: "Data!$C$2:$C$6" },
      { name: "Factor", text: "0.7" },
      { name: "Pair", text: "SUM(Data!$C$2:$C$3)" },
      { name: "Local", text: "100", scope: 0 },
      { name: "Local", text: "7", scope: 1 },
    ],
  };
}

/** Row of each case on sheet Cases. */
export function caseRows(): Map<string, number> {
  const out = new Map<string, number>();
  let row = FIRST_CASE_ROW;
  for (const c of CASES) {
    out.set(c.id, row);
    row += (c.spill?.[0] ?? 1) + (c.spill ? 1 : 0);
  }
  return out;
}
