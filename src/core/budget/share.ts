/**
 * CLIENTSHARE and MIXSHARE: the airtime a client, or a mix of clients, needs
 * to carry its demand. The goodput comes from the MAC (GOODPUT) and the
 * contention model (SATURATE); this file adds no model of its own.
 */
import { describe, finiteNumber, isMissing } from "../args";
import { AirtallyError, invalid } from "../errors";
import { goodputMbps, parseAccess, parseMacOptions } from "../mac/index";
import { saturationGoodputTcpMbps } from "./tcp";
import { asLink } from "../phy/index";
import type { MbPerSecond, Share } from "../units";
import { atMost, nonNegative, optionalNumber } from "../rf/_lib";

/** Catalog defaults (DESIGN.md §2). */
export const DEFAULT_PACKET_BYTES = 1500;
export const DEFAULT_STATIONS = 1;

function readStations(stations: unknown): number {
  const n = optionalNumber("stations", stations, DEFAULT_STATIONS);
  if (!Number.isInteger(n) || n < 1) invalid(`stations: must be a whole number of contending stations, 1 or more, got ${n}`);
  return n;
}

/**
 * The goodput one channel delivers on this link, Mb/s: with one station,
 * GOODPUT (one station alone, no protection, no loss); with more, SATURATE —
 * the aggregate goodput of `stations` identical saturated stations on that
 * link, i.e. what the channel carries at that link once contention (idle
 * backoff and collisions) is paid; `TCP` in mac_options adds the receiver's
 * acknowledgements (src/core/mac/tcp.ts, budget/tcp.ts). `mpdus` is GOODPUT's: "auto" (the
 * aggregation limit) or the MPDUs each access carries — 1 for traffic sent
 * one packet per access (voice), which is then charged a whole access per
 * packet.
 */
function channelGoodputMbps(link: unknown, packetBytes: unknown, stations: number, access: unknown, macOptions: unknown, mpdus: unknown): MbPerSecond {
  return stations === 1
    ? goodputMbps(link, packetBytes, mpdus, access, null, null, macOptions)
    : saturationGoodputTcpMbps(link, stations, packetBytes, mpdus, access, null, macOptions);
}

/**
 * CLIENTSHARE: share of a channel's airtime one client needs to carry
 * `demand_mbps` on `link`: demand ÷ channel goodput at that link (above).
 * A share above 1 means the demand needs more than one channel; it is kept,
 * never clamped (DESIGN.md §4).
 *
 * Example: clientShare(link, 10) with GOODPUT(link, 1500) = 40 Mb/s → 0.25.
 * Voice, one 200-octet packet per VO access: clientShare(link, 0.1, 200, 1,
 * "VO", null, 1) = 0.1 ÷ GOODPUT(link, 200, 1, "VO").
 */
export function clientShare(
  link: unknown,
  demandMbps: unknown,
  packetBytes?: unknown,
  stations?: unknown,
  access?: unknown,
  macOptions?: unknown,
  mpdus?: unknown,
): Share {
  // 1 Tb/s per client is beyond any Wi-Fi link; the bound keeps the share finite.
  const demand = atMost("demand_mbps", nonNegative("demand_mbps", finiteNumber("demand_mbps", demandMbps), "Mb/s"), 1e6, "Mb/s");
  const bytes = isMissing(packetBytes) ? DEFAULT_PACKET_BYTES : packetBytes;
  const capacity = channelGoodputMbps(link, bytes, readStations(stations), access, macOptions, mpdus);
  if (!(capacity > 0)) invalid(`link: ${asLink(link).text} delivers no goodput with these settings`);
  return demand / capacity;
}

/** Cells of a range (any[][]), a row, or a single value, in reading order. */
function cellsOf(value: unknown): unknown[] {
  if (!Array.isArray(value)) return [value];
  const cells: unknown[] = [];
  for (const row of value) {
    if (Array.isArray(row)) cells.push(...row);
    else cells.push(row);
  }
  return cells;
}

function isBlank(cell: unknown): boolean {
  return isMissing(cell) || (typeof cell === "string" && cell.trim() === "");
}

/** Largest count or demand per cell: beyond any site (a million clients, 1 Tb/s each); keeps the sum finite. */
const AMOUNT_MAX = 1e6;

/** A count or demand cell: blank → 0, else a finite number from 0 to AMOUNT_MAX. */
function amount(name: string, item: number, cell: unknown): number {
  if (isBlank(cell)) return 0;
  if (typeof cell !== "number" || !Number.isFinite(cell) || cell < 0 || cell > AMOUNT_MAX) {
    invalid(`${name}: item ${item} must be a number from 0 to ${AMOUNT_MAX}, got ${describe(cell)}`);
  }
  return cell;
}

/**
 * Errors about one row's own cells name the row and the range they came from
 * ("links: item 3: link: …", "accesses: item 2: access: …",
 * "mpdus: item 2: mpdus: …"); others (packet_bytes…) pass unchanged.
 */
const ROW_ARGUMENTS: readonly (readonly [string, string])[] = [
  ["link:", "links"],
  ["access:", "accesses"],
  ["mpdus:", "mpdus"],
  ["mac_options:", "accesses"],
];

function forItem<T>(item: number, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (!(e instanceof AirtallyError)) throw e;
    const row = ROW_ARGUMENTS.find(([prefix]) => e.message.startsWith(prefix));
    if (!row) throw e;
    throw new AirtallyError(e.kind, `${row[1]}: item ${item}: ${e.message}`);
  }
}

/**
 * One `accesses` cell: an access category, optionally followed by MAC
 * settings for that class ("BE TCP", "VO open"), since MIXSHARE has no
 * mac_options of its own. Blank → BE and no settings.
 */
function classAccess(cell: unknown): { access: unknown; macOptions: unknown } {
  if (typeof cell !== "string") return { access: cell, macOptions: null };
  const [access, ...settings] = cell.trim().split(/\s+/);
  return { access, macOptions: settings.length > 0 ? settings.join(" ") : null };
}

/**
 * A per-class range parallel to `links` (accesses, mpdus): omitted → every
 * class takes the default (null); given, it must have as many cells as
 * `links`, and a blank cell is that class's default.
 */
function perClass(name: string, value: unknown, n: number): unknown[] {
  if (isMissing(value)) return new Array<unknown>(n).fill(null);
  const cells = cellsOf(value).map((c) => (isBlank(c) ? null : c));
  if (cells.length !== n) {
    invalid(`${name}: has ${cells.length} cells but links has ${n}; give one cell per class (blank for the default), a range the same size as links`);
  }
  return cells;
}

/**
 * MIXSHARE: total airtime share of a client mix, Σ count × CLIENTSHARE(link,
 * demand, packet_bytes, stations) over three ranges of the same number of
 * cells (any shape; read row by row): link text, client count, demand per
 * client in Mb/s. Counts may be fractional (average active clients).
 *
 * `accesses` and `mpdus` are optional ranges of the same number of cells:
 * each class's access category (default BE), optionally followed by MAC
 * settings for the class ("BE TCP"), and MPDUs per access (default "auto";
 * 1 for traffic sent one packet per access, such as voice).
 *
 * A row whose link cell is blank is skipped when its count and demand are
 * blank or 0 too; a blank link with a count and demand is refused (a client
 * class with no link is a mistake, not nothing). `stations` omitted → 1, as
 * in CLIENTSHARE. Mismatched ranges → #VALUE!.
 *
 * Example: links {A; B}, counts {10; 2}, demands {2; 20} →
 * 10 × CLIENTSHARE(A, 2) + 2 × CLIENTSHARE(B, 20); with accesses {BE; VO} and
 * mpdus {"auto"; 1} the second term is 2 × CLIENTSHARE(B, 20, 1500, 1, "VO", , 1).
 */
export function mixShare(
  links: unknown,
  counts: unknown,
  demandsMbps: unknown,
  packetBytes?: unknown,
  stations?: unknown,
  accesses?: unknown,
  mpdus?: unknown,
): Share {
  const linkCells = cellsOf(links);
  const countCells = cellsOf(counts);
  const demandCells = cellsOf(demandsMbps);
  if (countCells.length !== linkCells.length) {
    invalid(`counts: has ${countCells.length} cells but links has ${linkCells.length}; the three ranges must have the same number of cells`);
  }
  if (demandCells.length !== linkCells.length) {
    invalid(`demands_mbps: has ${demandCells.length} cells but links has ${linkCells.length}; the three ranges must have the same number of cells`);
  }
  const accessCells = perClass("accesses", accesses, linkCells.length).map(classAccess);
  const mpduCells = perClass("mpdus", mpdus, linkCells.length);
  const nStations = readStations(stations);
  let total = 0;
  for (let i = 0; i < linkCells.length; i++) {
    const item = i + 1;
    const count = amount("counts", item, countCells[i]);
    const demand = amount("demands_mbps", item, demandCells[i]);
    if (isBlank(linkCells[i])) {
      if (count > 0 && demand > 0) invalid(`links: item ${item} is empty but counts and demands_mbps give ${count} clients at ${demand} Mb/s; fill in the link or clear the row`);
      continue;
    }
    if (count === 0 || demand === 0) {
      forItem(item, () => (asLink(linkCells[i]), parseAccess(accessCells[i].access), parseMacOptions(accessCells[i].macOptions))); // still catch a mistyped link, access or setting
      continue;
    }
    total += count * forItem(item, () => clientShare(linkCells[i], demand, packetBytes, nStations, accessCells[i].access, accessCells[i].macOptions, mpduCells[i]));
  }
  return total;
}
