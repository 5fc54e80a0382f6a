/**
 * SATURATE with `TCP` in mac_options: a wrapper around the contention
 * model's result, kept apart from src/core/contention so that model stays
 * one of data accesses only.
 *
 * Model (simple, and an upper bound): the stations' data accesses contend as
 * SATURATE solves them (with the TCP settings taken out of mac_options); the
 * receivers' TCP acknowledgements then add their own uncontended channel
 * accesses in series, one per TCPACK delivered segments (src/core/mac/tcp.ts):
 *   TCP SATURATE = 1 ÷ (1 ÷ S + T_ACK ÷ (8 × packet_bytes × n))
 * The collisions that ACK accesses would add to the data's (and the data's
 * to theirs) are not counted, so with many stations the result is somewhat
 * optimistic.
 */
import type { MbPerSecond } from "../units";
import { invalid } from "../errors";
import { exchangeContext, parseMacOptions, withTcpAcks, withoutTcpText } from "../mac/index";
import { saturationGoodputMbps } from "../contention/index";

/** SATURATE (catalog), TCP acknowledgements included when mac_options says TCP. */
export function saturationGoodputTcpMbps(
  link: unknown,
  stations: unknown,
  packetBytes: unknown,
  mpdus?: unknown,
  access?: unknown,
  protection?: unknown,
  macOptions?: unknown,
): MbPerSecond {
  if (typeof macOptions !== "string" || !/TCP/i.test(macOptions)) {
    return saturationGoodputMbps(link, stations, packetBytes, mpdus, access, protection, macOptions);
  }
  const ctx = exchangeContext(link, packetBytes, access, protection, macOptions); // checks every argument, TCP settings too
  const data = saturationGoodputMbps(link, stations, packetBytes, mpdus, access, protection, withoutTcpText(macOptions));
  return withTcpAcks(ctx, data);
}

/**
 * mac_options for a model of data accesses alone (CONTENTION, EDCAMIX):
 * `TCP` there would be silently ignored, so it is refused instead.
 */
export function dataOnlyMacOptions(functionName: string, macOptions: unknown): unknown {
  if (typeof macOptions === "string" && parseMacOptions(macOptions).tcp) {
    invalid(`mac_options: ${functionName} models the data accesses only and does not count TCP acknowledgements; drop TCP (GOODPUT, EFFICIENCY, SATURATE, CLIENTSHARE and MIXSHARE count them)`);
  }
  return macOptions;
}
