/**
 * The public barrel of the Airtally core: everything the spreadsheet layer,
 * the command line and the tests use. `src/core` imports nothing from Office,
 * the DOM or Node.
 */
export * from "./errors";
export * from "./units";
export { memoStats, BoundedMemo } from "./memo";
export type { MemoStats } from "./memo";
export { parseLink, formatLink, canonicalLink, buildLink, FAMILIES, NON_HT_FAMILIES } from "./link";
export type { Link, Family, BandGHz, Coding } from "./link";
export * as phy from "./phy/index";
export { rateMbps, txtime, txtimeUs, psduFit, sensitivityDbm, maxPsduBytes, txtimeTable } from "./phy/index";
export { breakdownTable, edcaMixTable } from "./audit";
export type { SpillRow } from "./audit";
export * as mac from "./mac/index";
export * as contention from "./contention/index";
export * as rf from "./rf/index";
export * as budget from "./budget/index";
export * as mu from "./mu/index";
export { resolvedDefault, resultChain, type ChainRow } from "./explain";
