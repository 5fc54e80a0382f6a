/**
 * MUACCESS, MUGOODPUT and MUBREAKDOWN: one HE/EHT multi-user exchange in
 * which an AP serves `users` stations at once, each on the link's RU.
 *
 *   down: AIFS + mean backoff + MU PPDU (each user's A-MPDU, with a Basic
 *         Trigger for that user aggregated in it) + SIFS + TB PPDU (every
 *         user's BlockAck, or Ack after one MPDU);
 *         with MUBAR: AIFS + backoff + MU PPDU + SIFS + MU-BAR trigger at the
 *         control rate + SIFS + TB PPDU of the acknowledgements.
 *   up:   AIFS + mean backoff + Basic Trigger at the control rate + SIFS
 *         + TB PPDU (each user's A-MPDU; its length from the trigger's UL
 *         Length) + SIFS + Multi-STA BlockAck at the control rate.
 *
 * Scheduling assumptions (stated on the functions' help pages): every user
 * has data; all users are alike (the same link, RU, packet and MPDU count),
 * so no user pads to a longer one; no MU-MIMO; no random access (UORA);
 * the AP wins the channel with no collision, under its own EDCA parameters
 * (the `AP` defaults of Table 9-155's AP column; AIFSN=, CWMIN=, TXOP=
 * still override them). Control frames go in a non-HT PPDU at the control
 * response rate of the link (mac/response.ts), as ACCESS sends its BlockAck.
 *
 * Our choices where the standard leaves the AP free: the trigger aggregated
 * in a downlink A-MPDU has no Padding (the PPDU's packet extension gives the
 * stations their processing time); a trigger sent alone pads for 16 µs
 * (frames.ts); the acknowledgement TB PPDU runs at the HE-MCS matching the
 * control rate on one stream (ppdu.ts).
 */
import { invalid } from "../errors";
import { describe, isMissing } from "../args";
import type { Bytes, MbPerSecond, Microseconds } from "../units";
import { asLink, maxPsduBytes, txtimeUs } from "../phy/index";
import { parseMacOptions } from "../mac/options";
import { parseAccess } from "../mac/edca";
import { aPPDUMaxTime_us } from "../mac/timing";
import { AMPDU_DELIMITER_octets, ampduLength } from "../mac/frames";
import { aggregationLimit, largestWhere } from "../mac/aggregation";
import { exchangeContext, psduBytesFor, responseBytesFor, usesBlockAck, type ExchangeContext } from "../mac/exchange";
import { meanBackoffUs, type AccessTerm } from "../mac/access";
import { checkMultiUserLink, checkUsers } from "./ru";
import { multiStaBlockAckBytes, triggerFrameBytes, triggerPaddingOctets } from "./frames";
import { ackTbLink, checkTbGiLtf, muPpdu, ruOf, tbPpdu, type Ppdu } from "./ppdu";

export type Direction = "down" | "up";

/** direction: down (AP to stations, default) or up (stations to AP); DL/UL and downlink/uplink too, any case. */
export function parseDirection(value: unknown): Direction {
  if (isMissing(value)) return "down";
  if (typeof value === "string") {
    const t = value.trim().toLowerCase();
    if (t === "down" || t === "dl" || t === "downlink") return "down";
    if (t === "up" || t === "ul" || t === "uplink") return "up";
  }
  return invalid(`direction: expected down (AP to stations) or up (stations to AP), got ${describe(value)}`);
}

export interface MuExchange {
  /** MUBREAKDOWN rows in order of transmission; the total is not among them. */
  readonly terms: readonly AccessTerm[];
  /** MUACCESS: the sum of the terms, µs. */
  readonly totalUs: Microseconds;
  readonly users: number;
  readonly direction: Direction;
  /** MPDUs per user. */
  readonly mpdus: number;
  readonly msdusPerMpdu: number;
  readonly packetBytes: Bytes;
}

/** Everything an exchange of n MPDUs per user depends on, fixed once per call. */
interface Plan {
  readonly ctx: ExchangeContext;
  readonly users: number;
  readonly direction: Direction;
  readonly muBar: boolean;
}

/** A trigger aggregated in a user's A-MPDU: a Basic Trigger with that user's User Info, no padding. */
function aggregatedTriggerBytes(plan: Plan): Bytes {
  return triggerFrameBytes("basic", 1, plan.ctx.link.family, 0);
}

/** One user's PSDU: its A-MPDU (S-MPDU for one MPDU), plus the aggregated trigger in `down` without MUBAR. */
function userPsduBytes(plan: Plan, n: number): Bytes {
  if (plan.direction === "up" || plan.muBar) return psduBytesFor(plan.ctx, n);
  const data = ampduLength(plan.ctx.mpduBytes, n);
  return Math.ceil(data / 4) * 4 + AMPDU_DELIMITER_octets + aggregatedTriggerBytes(plan);
}

function dataPpdu(plan: Plan, n: number): Ppdu {
  const psdu = userPsduBytes(plan, n);
  return plan.direction === "up" ? tbPpdu(plan.ctx.link, psdu) : muPpdu(plan.ctx.link, plan.users, psdu);
}

/** A control frame in a non-HT PPDU at the control rate; refused (naming users) past the non-HT PSDU limit. */
function controlFrameUs(plan: Plan, bytes: Bytes, what: string): Microseconds {
  const max = maxPsduBytes(plan.ctx.controlLink);
  if (bytes > max) controlFrameTooLong(plan, bytes, what, max);
  return txtimeUs(plan.ctx.controlLink, bytes);
}

function controlFrameTooLong(plan: Plan, bytes: Bytes, what: string, max: Bytes): never {
  invalid(`users: the ${what} for ${plan.users} users is ${bytes} octets, over the ${max} octets a non-HT PPDU carries at ${plan.ctx.controlRateMbps} Mb/s; use fewer users`);
}

function triggerAloneBytes(plan: Plan, kind: "basic" | "mubar"): Bytes {
  return triggerFrameBytes(kind, plan.users, plan.ctx.link.family, triggerPaddingOctets(plan.ctx.controlRateMbps));
}

function multiStaBytes(plan: Plan, n: number): Bytes {
  return multiStaBlockAckBytes(plan.users, usesBlockAck(n), plan.ctx.baWindow);
}

/** The exchange's terms after the backoff, for n MPDUs per user. */
function exchangeTerms(plan: Plan, n: number): AccessTerm[] {
  const { ctx, users } = plan;
  const sifs = ctx.edca.sifsUs;
  const rate: MbPerSecond = ctx.controlRateMbps;
  const fam = ctx.link.family;
  const ru = ruOf(ctx.link);
  const psdu = userPsduBytes(plan, n);
  const trigger = plan.direction === "down" && !plan.muBar;
  const what = trigger ? `${n} MPDU${n > 1 ? "s" : ""} and a Basic Trigger` : usesBlockAck(n) ? `A-MPDU of ${n} MPDUs` : "S-MPDU";
  const data = dataPpdu(plan, n);
  if (plan.direction === "up") {
    const basic = triggerAloneBytes(plan, "basic");
    const mba = multiStaBytes(plan, n);
    const tb = data as ReturnType<typeof tbPpdu>;
    return [
      { label: `Basic Trigger (${users} User Info, ${basic} octets, ${rate} Mb/s)`, us: controlFrameUs(plan, basic, "Basic Trigger") },
      { label: "SIFS", us: sifs },
      { label: `${fam} TB PPDU (${users} × ${what} on ${ru}, ${psdu} octets each, UL Length ${tb.ulLength})`, us: data.totalUs },
      { label: "SIFS", us: sifs },
      { label: `Multi-STA BlockAck (${users} users, ${mba} octets, ${rate} Mb/s)`, us: controlFrameUs(plan, mba, "Multi-STA BlockAck") },
    ];
  }
  const ppduName = ctx.link.ruTones === null ? `${fam} PPDU (1 user, ${what}, whole channel` : `${fam} MU PPDU (${users} × ${what} on ${ru}`;
  const terms: AccessTerm[] = [
    { label: `${ppduName}, ${psdu} octets each)`, us: data.totalUs },
    { label: "SIFS", us: sifs },
  ];
  if (plan.muBar) {
    const bar = triggerAloneBytes(plan, "mubar");
    terms.push({ label: `MU-BAR trigger (${users} User Info, ${bar} octets, ${rate} Mb/s)`, us: controlFrameUs(plan, bar, "MU-BAR") }, { label: "SIFS", us: sifs });
  }
  const ackLink = ackTbLink(ctx.link, rate);
  const ack = tbPpdu(ackLink, responseBytesFor(ctx, n) + AMPDU_DELIMITER_octets);
  terms.push({ label: `${fam} TB PPDU (${users} × ${usesBlockAck(n) ? "BlockAck" : "Ack"} on ${ru}, MCS${ackLink.mcs} 1SS)`, us: ack.totalUs });
  return terms;
}

function sumUs(terms: readonly AccessTerm[]): Microseconds {
  let total = 0;
  for (const t of terms) total += t.us;
  return Math.round(total * 1e9) / 1e9;
}

/** The most MPDUs per user: the single-user limits (block ack window, A-MPDU length), then aPPDUMaxTime on this PPDU and the TXOP limit on this exchange. */
function mpduLimit(plan: Plan): { count: number; reason: string } {
  const { ctx } = plan;
  const single = aggregationLimit({ ...ctx, edca: { ...ctx.edca, txopLimitUs: 0 } });
  const fits = (n: number) => userPsduBytes(plan, n) <= ctx.maxAmpduBytes && dataPpdu(plan, n).totalUs <= aPPDUMaxTime_us;
  if (!fits(1)) onePpduTooLong(plan);
  let count = largestWhere(1, single.count, fits);
  let reason = count < single.count ? `aPPDUMaxTime (${aPPDUMaxTime_us} µs) or the maximum A-MPDU length (${ctx.maxAmpduBytes} octets)` : single.reason;
  const txop = ctx.edca.txopLimitUs;
  if (txop > 0) {
    const byTxop = largestWhere(1, count, (n) => sumUs(exchangeTerms(plan, n)) <= txop);
    if (byTxop < count) {
      count = byTxop;
      reason = `the TXOP limit (${txop} µs)`;
    }
  }
  return { count, reason };
}

function onePpduTooLong(plan: Plan): never {
  invalid(
    `packet_bytes: one ${plan.ctx.mpduBytes}-octet MPDU per user does not fit one ${plan.direction === "up" ? "TB" : "MU"} PPDU on ${plan.ctx.link.text} ` +
      `(aPPDUMaxTime ${aPPDUMaxTime_us} µs, maximum A-MPDU length ${plan.ctx.maxAmpduBytes} octets); use smaller packets or a faster MCS`,
  );
}

function resolveMuMpdus(plan: Plan, mpdus: unknown): number {
  const limit = mpduLimit(plan);
  if (isMissing(mpdus) || (typeof mpdus === "string" && mpdus.trim().toLowerCase() === "auto")) return limit.count;
  if (typeof mpdus !== "number" || !Number.isInteger(mpdus) || mpdus < 1) {
    invalid(`mpdus: expected "auto" or a whole number of MPDUs per user of 1 or more, got ${describe(mpdus)}`);
  }
  if (mpdus > limit.count) {
    invalid(`mpdus: ${mpdus} is more than fit per user in this exchange: at most ${limit.count}, set by ${limit.reason}; use "auto" or ${limit.count} or fewer`);
  }
  return mpdus;
}

/** One multi-user exchange (MUACCESS is `.totalUs`, MUBREAKDOWN is `.terms` then the total). */
export function muExchange(
  link: unknown,
  users: unknown,
  packetBytes: unknown,
  direction?: unknown,
  mpdus?: unknown,
  access?: unknown,
  macOptions?: unknown,
): MuExchange {
  const l = asLink(link);
  checkMultiUserLink(l);
  const k = checkUsers(users, l);
  const dir = parseDirection(direction);
  if (parseAccess(access) === "DCF") invalid(`access: a multi-user exchange runs under EDCA; choose BK, BE, VI or VO (DCF has no OFDMA)`);
  const parsed = parseMacOptions(macOptions);
  if (parsed.muBar && dir === "up") invalid(`mac_options: MUBAR asks the downlink acknowledgements with a MU-BAR; direction up ends with a Multi-STA BlockAck — drop MUBAR`);
  if (dir === "up") checkTbGiLtf(l);
  const ctx = exchangeContext(l, packetBytes, access, "none", parsed.ap ? parsed : { ...parsed, ap: true });
  const plan: Plan = { ctx, users: k, direction: dir, muBar: parsed.muBar };
  const n = resolveMuMpdus(plan, mpdus);
  const { edca } = ctx;
  const terms: AccessTerm[] = [
    { label: `AIFS[${edca.access}] (AIFSN ${edca.aifsn}, AP)`, us: edca.aifsUs },
    { label: `mean backoff (CWmin ${edca.cwMin} ÷ 2 × ${edca.slotUs} µs slot)`, us: meanBackoffUs(edca) },
    ...exchangeTerms(plan, n),
  ];
  return Object.freeze({
    terms: Object.freeze(terms.map((t) => Object.freeze(t))),
    totalUs: sumUs(terms),
    users: k,
    direction: dir,
    mpdus: n,
    msdusPerMpdu: ctx.msdusPerMpdu,
    packetBytes: ctx.packetBytes,
  });
}

/** MUACCESS (catalog): airtime of one multi-user exchange, µs. */
export function muAccessUs(link: unknown, users: unknown, packetBytes: unknown, direction?: unknown, mpdus?: unknown, access?: unknown, macOptions?: unknown): Microseconds {
  return muExchange(link, users, packetBytes, direction, mpdus, access, macOptions).totalUs;
}

/** MUGOODPUT (catalog): packet bits of every user ÷ MUACCESS, Mb/s (alone on the channel, no loss). */
export function muGoodputMbps(link: unknown, users: unknown, packetBytes: unknown, direction?: unknown, mpdus?: unknown, access?: unknown, macOptions?: unknown): MbPerSecond {
  const x = muExchange(link, users, packetBytes, direction, mpdus, access, macOptions);
  return (8 * x.packetBytes * x.msdusPerMpdu * x.mpdus * x.users) / x.totalUs;
}

/** MUBREAKDOWN (catalog): [term (µs), value] rows, then ["total (µs)", MUACCESS]. */
export function muBreakdownTable(link: unknown, users: unknown, packetBytes: unknown, direction?: unknown, mpdus?: unknown, access?: unknown, macOptions?: unknown): (string | number)[][] {
  const x = muExchange(link, users, packetBytes, direction, mpdus, access, macOptions);
  const rows: (string | number)[][] = x.terms.map((t) => [`${t.label} (µs)`, t.us]);
  rows.push(["total (µs)", x.totalUs]);
  return rows;
}
