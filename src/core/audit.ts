/**
 * Spill tables for the audit functions: the rows a spreadsheet shows, built
 * from the core results so that a spilled total is the very number the
 * scalar function returns (BREAKDOWN's total is ACCESS; TXTIMEPARTS' total
 * is TXTIME).
 */
import { channelAccess } from "./mac/index";
import { edcaMix } from "./contention/index";

export type SpillRow = (string | number)[];

/** BREAKDOWN: [term, µs] for each component of one channel access, then ["total (µs)", ACCESS]. */
export function breakdownTable(
  link: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  access?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): SpillRow[] {
  const a = channelAccess(link, packetBytes, mpdus, access, protection, macOptions);
  const rows: SpillRow[] = a.terms.map((t) => [`${t.label} (µs)`, t.us]);
  rows.push(["total (µs)", a.totalUs]);
  return rows;
}

/** EDCAMIX: one row per class — access category, stations, aggregate goodput Mb/s, goodput per station Mb/s, share of airtime. */
export function edcaMixTable(
  link: unknown,
  accessList: unknown,
  counts: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): SpillRow[] {
  return edcaMix(link, accessList, counts, packetBytes, mpdus, protection, macOptions).map((r) => [
    r.access,
    r.stations,
    r.goodputMbps,
    r.perStationMbps,
    r.airtimeShare,
  ]);
}
