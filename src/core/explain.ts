/**
 * What "Explain this cell" shows beyond the audit tables: the value each
 * omitted argument takes (resolved here, by the core that applies it, not by
 * the pane), and for GOODPUT, EFFICIENCY, SATURATE and CLIENTSHARE the
 * arithmetic from one channel access (BREAKDOWN) to the result: bits ÷ time.
 *
 *   resolvedDefault("GOODPUT", "mpdus", { link: "HE MCS7 20MHz", packet_bytes: 1500 }) → 'auto = 64 (AGGCOUNT)'
 *   resultChain("GOODPUT", { link: "OFDM 54Mbps 5GHz", packet_bytes: 1500 }) → rows ending in ["GOODPUT (Mb/s)", 29.52…]
 */
import { AirtallyError } from "./errors";
import { isMissing } from "./args";
import { asLink } from "./phy/index";
import { rateMbps } from "./phy/index";
import { aggCount, channelAccess, exchangeContext, goodputMbps, parseAccess, parseMpduLoss, tcpAckAccessUs, tcpAckSegments } from "./mac/index";
import { contentionShare } from "./contention/index";
import { clientShare, saturationGoodputTcpMbps, DEFAULT_PACKET_BYTES, DEFAULT_STATIONS, DEFAULT_MAX_UTILIZATION, DEFAULT_OVERLAP_SHARE, DEFAULT_INTERVAL_TU, defaultBeaconBytes } from "./budget/index";
import { DEFAULT_DISTANCE_POWER, DEFAULT_NOISE_FIGURE_dB, commonWallLossDb, officeFloorLossDb } from "./rf/index";
import { withoutTcpText } from "./mac/index";

export type Args = Readonly<Record<string, unknown>>;
export type ChainRow = [string, string | number];

/** Catalog defaults that are plain constants (DESIGN.md §2), by parameter name. */
const CONSTANT_DEFAULTS: Readonly<Record<string, string | number>> = {
  protection: "none",
  mpdu_loss: 0,
  mac_options: "none: CCMP-128, one MSDU per MPDU, the family's block ack window and the access category's TXOP limit",
  distance_power: DEFAULT_DISTANCE_POWER,
  floors: 0,
  walls: 0,
  rx_gain_dbi: 0,
  noise_figure_db: DEFAULT_NOISE_FIGURE_dB,
  margin_db: 0,
  streams: 1,
  width_mhz: 20,
  cwmin: 15,
  cwmax: 1023,
  retry_limit: 7,
  mode: "selective",
  aps_heard: 1,
  interval_tu: DEFAULT_INTERVAL_TU,
  overlap_share: DEFAULT_OVERLAP_SHARE,
  max_utilization: DEFAULT_MAX_UTILIZATION,
  overhead_share: 0,
  stations: DEFAULT_STATIONS,
};

/** Functions whose packet_bytes is optional (default 1500). */
const PACKET_DEFAULT_IDS = new Set(["CLIENTSHARE", "MIXSHARE"]);

function packetOf(id: string, a: Args): unknown {
  return isMissing(a.packet_bytes) && PACKET_DEFAULT_IDS.has(id) ? DEFAULT_PACKET_BYTES : a.packet_bytes;
}

/** Defaults that depend on the other arguments. */
function dependentDefault(id: string, name: string, a: Args): string | number | null {
  switch (name) {
    case "access":
      return parseAccess(null);
    case "packet_bytes":
      return PACKET_DEFAULT_IDS.has(id) ? DEFAULT_PACKET_BYTES : null;
    case "mpdus":
      if (id === "MIXSHARE") return "auto for every class (AGGCOUNT of its link)";
      if (isMissing(a.link)) return null;
      return `auto = ${aggCount(a.link, packetOf(id, a), a.access, a.mac_options, a.protection)} (AGGCOUNT)`;
    case "accesses":
      return `${parseAccess(null)} for every class`;
    case "floor_loss_db": {
      const floors = isMissing(a.floors) ? 0 : Number(a.floors);
      if (floors === 0) return "not used (no floors)";
      return `L_f(${floors}) = ${officeFloorLossDb(Number(a.freq_mhz), floors)} dB in all (ITU-R P.1238-7 Table 3, office; from memory)`;
    }
    case "wall_loss_db": {
      if (isMissing(a.walls) || Number(a.walls) === 0) return "not used (no walls)";
      return `${commonWallLossDb(Number(a.freq_mhz))} dB per wall (plasterboard, common practice)`;
    }
    case "band_ghz":
      return id === "TOPLINK" ? "the family's default band (2.4 GHz for DSSS, HR-DSSS and ERP-OFDM, else 5 GHz)" : 5;
    case "gi_us":
      return "0.8 µs for HT, VHT, HE and EHT";
    case "beacon_bytes":
      return isMissing(a.beacon_link) ? null : `${defaultBeaconBytes(asLink(a.beacon_link).bandGHz)} (typical EHT AP beacon for the band)`;
    default:
      return null;
  }
}

/**
 * The value an omitted argument takes, as the function applies it; null when
 * it cannot be resolved from the other arguments (they are invalid, or the
 * parameter has no default).
 */
export function resolvedDefault(id: string, name: string, args: Args): string | number | null {
  try {
    const dependent = dependentDefault(id, name, args);
    if (dependent !== null) return dependent;
    return name in CONSTANT_DEFAULTS ? CONSTANT_DEFAULTS[name] : null;
  } catch (e) {
    if (e instanceof AirtallyError) return null;
    throw e;
  }
}

/** Bits per access and one channel access's time, the first rows of every chain. */
function accessRows(a: Args, packet: unknown, mpdus: unknown, access: unknown, protection: unknown, macOptions: unknown) {
  const acc = channelAccess(a.link, packet, mpdus, access, protection, withoutTcpText(macOptions));
  const bits = 8 * acc.packetBytes * acc.msdusPerMpdu * acc.mpdus;
  const rows: ChainRow[] = [
    [`packet bits per access = 8 × ${acc.packetBytes} bytes × ${acc.msdusPerMpdu} MSDU × ${acc.mpdus} MPDU`, bits],
    ["one channel access, ACCESS (µs) = BREAKDOWN total", acc.totalUs],
  ];
  return { acc, bits, rows };
}

/** The TCP step (src/core/mac/tcp.ts), when mac_options says TCP. */
function tcpRows(link: unknown, packet: unknown, access: unknown, protection: unknown, macOptions: unknown, before: number, label: string): { rows: ChainRow[]; value: number } {
  const ctx = exchangeContext(link, packet, access, protection, macOptions);
  if (!ctx.options.tcp) return { rows: [], value: before };
  const ackUs = tcpAckAccessUs(ctx);
  const n = tcpAckSegments(ctx.options);
  const value = 1 / (1 / before + ackUs / (8 * ctx.packetBytes * n));
  return {
    rows: [
      ["TCP ACK access on the reverse link, 40-byte packet (µs)", ackUs],
      [`${label} with TCP ACKs = 1 ÷ (1 ÷ ${round(before)} + ${round(ackUs)} µs ÷ (8 × ${ctx.packetBytes} × ${n} segments))`, value],
    ],
    value,
  };
}

function round(x: number): number {
  return Math.round(x * 1e4) / 1e4;
}

function goodputChain(a: Args): ChainRow[] {
  const { acc, bits, rows } = accessRows(a, a.packet_bytes, a.mpdus, a.access, a.protection, a.mac_options);
  const lossless = bits / acc.totalUs;
  rows.push([`goodput without loss = ${bits} bits ÷ ${acc.totalUs} µs (Mb/s)`, lossless]);
  const p = parseMpduLoss(a.mpdu_loss);
  let g = lossless;
  if (p > 0) {
    g = goodputMbps(a.link, a.packet_bytes, a.mpdus, a.access, a.protection, a.mpdu_loss, withoutTcpText(a.mac_options));
    rows.push([acc.mpdus >= 2 ? `with MPDU loss ${p}: (1 − ${p}) × ${round(lossless)} (selective retransmission)` : `with MPDU loss ${p}: whole-frame retransmission with backoff doubling (GOODPUT's model)`, g]);
  }
  const tcp = tcpRows(a.link, a.packet_bytes, a.access, a.protection, a.mac_options, g, "goodput");
  rows.push(...tcp.rows);
  const result = goodputMbps(a.link, a.packet_bytes, a.mpdus, a.access, a.protection, a.mpdu_loss, a.mac_options);
  rows.push(["GOODPUT (Mb/s)", result]);
  return rows;
}

function saturateChain(a: Args, packet: unknown, stations: unknown, mpdus: unknown, access: unknown, protection: unknown, macOptions: unknown): { rows: ChainRow[]; value: number } {
  const { acc, bits, rows } = accessRows(a, packet, mpdus, access, protection, macOptions);
  const dataOnly = withoutTcpText(macOptions);
  const c = contentionShare(a.link, stations, packet, mpdus, access, protection, dataOnly);
  const exchange = acc.totalUs - acc.backoffUs;
  const perSuccess = exchange / (1 - c);
  rows.push(
    ["less the mean backoff: AIFS + exchange of a success (µs)", exchange],
    [`share of airtime in idle slots and collisions, CONTENTION (${stations} stations)`, c],
    [`channel time per successful access = ${round(exchange)} ÷ (1 − ${round(c)}) (µs)`, perSuccess],
    [`aggregate goodput = ${bits} bits ÷ ${round(perSuccess)} µs (Mb/s)`, bits / perSuccess],
  );
  const tcp = tcpRows(a.link, packet, access, protection, macOptions, bits / perSuccess, "aggregate goodput");
  rows.push(...tcp.rows);
  const value = saturationGoodputTcpMbps(a.link, stations, packet, mpdus, access, protection, macOptions);
  rows.push(["SATURATE (Mb/s)", value]);
  return { rows, value };
}

function clientShareChain(a: Args): ChainRow[] {
  const packet = packetOf("CLIENTSHARE", a);
  const stations = isMissing(a.stations) ? DEFAULT_STATIONS : a.stations;
  const rows: ChainRow[] =
    stations === 1
      ? goodputChain({ link: a.link, packet_bytes: packet, mpdus: a.mpdus, access: a.access, mac_options: a.mac_options })
      : saturateChain(a, packet, stations, a.mpdus, a.access, null, a.mac_options).rows;
  const capacity = rows[rows.length - 1][1] as number;
  const result = clientShare(a.link, a.demand_mbps, a.packet_bytes, a.stations, a.access, a.mac_options, a.mpdus);
  rows.push([`CLIENTSHARE = ${a.demand_mbps} Mb/s ÷ ${round(capacity)} Mb/s`, result]);
  return rows;
}

/**
 * The arithmetic from one channel access to the result, one row per step,
 * the result last; null for functions without such a chain. Each step's
 * value is computed by the same core functions the cell calls.
 */
export function resultChain(id: string, a: Args): ChainRow[] | null {
  switch (id) {
    case "GOODPUT":
      return goodputChain(a);
    case "EFFICIENCY": {
      const rows = goodputChain(a);
      const g = rows[rows.length - 1][1] as number;
      const rate = rateMbps(a.link);
      rows.push([`EFFICIENCY = ${round(g)} ÷ RATE ${rate} Mb/s`, g / rate]);
      return rows;
    }
    case "SATURATE":
      return saturateChain(a, a.packet_bytes, a.stations, a.mpdus, a.access, a.protection, a.mac_options).rows;
    case "CLIENTSHARE":
      return clientShareChain(a);
    default:
      return null;
  }
}
