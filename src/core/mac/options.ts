/**
 * `mac_options` text (DESIGN.md §2): MAC settings that rarely change, as free
 * text. Tokens are case-insensitive, separated by spaces, commas or
 * semicolons; each setting may appear once. The numbers after `BASIC=` are
 * the one place where a comma separates values of one setting
 * (`BASIC=6,12,24`).
 *
 *   parseMacOptions("GCMP-256 AMSDU=2; TXOP=2080")
 *     → { cipher: "GCMP-256", amsdu: 2, txopLimitUs: 2080, … the rest default }
 *
 * Settings that depend on the link (BA window, A-MPDU exponent, slot time,
 * basic rates) are range-checked here against the widest family and again
 * against the link where they are used (aggregation.ts, timing.ts).
 */
import { invalid } from "../errors";
import { describe, isMissing, quoted } from "../args";
import type { MbPerSecond, Microseconds } from "../units";

export const CIPHERS = ["open", "CCMP-128", "CCMP-256", "GCMP-128", "GCMP-256"] as const;
export type Cipher = (typeof CIPHERS)[number];

export interface MacOptions {
  /** Data confidentiality protocol; CCMP-128 by default (the RSN baseline, IEEE 802.11-2020 12.5.3). */
  readonly cipher: Cipher;
  /** MSDUs per A-MSDU; 1 = no A-MSDU. */
  readonly amsdu: number;
  /** Block ack window (buffer size), MPDUs; null = the family default. */
  readonly baWindow: number | null;
  /** Maximum A-MPDU length exponent e (length 2^(13+e) − 1); null = the family maximum. */
  readonly ampduExponent: number | null;
  /** TXOP limit, µs; null = the access category's default. */
  readonly txopLimitUs: Microseconds | null;
  /** Use the AP's default EDCA parameters instead of a non-AP station's. */
  readonly ap: boolean;
  /** Advertised AIFSN override; null = default. */
  readonly aifsn: number | null;
  /** Advertised CWmin override; null = default. */
  readonly cwMin: number | null;
  /** Advertised CWmax override; null = default. */
  readonly cwMax: number | null;
  /** 2.4 GHz slot time, µs (9 short, 20 long); null = 9 where allowed. */
  readonly slotUs: 9 | 20 | null;
  /** BSS basic rate set, Mb/s, ascending; null = the PHY's mandatory set. */
  readonly basicRatesMbps: readonly MbPerSecond[] | null;
  /** HT Control field (+4 octets) in every data MPDU. */
  readonly htc: boolean;
  /** Transmission attempts before an MPDU is dropped; null = dot11ShortRetryLimit 7. */
  readonly retryLimit: number | null;
  /** Multi-user exchanges (src/core/mu): acknowledgements asked by a MU-BAR trigger instead of a trigger carried in the PPDU. */
  readonly muBar: boolean;
  /** TCP flow: count the receiver's TCP acknowledgements as accesses of their own (tcp.ts). */
  readonly tcp: boolean;
  /** TCP segments per acknowledgement (TCPACK=n); null = 2, delayed ACKs (tcp.ts). */
  readonly tcpAckSegments: number | null;
  /**
   * After a missed BlockAck, send a BlockAckReq in a channel access of its own
   * (its BlockAck resets CW) instead of retransmitting the MPDUs in the next
   * A-MPDU (the default). 10.25.6 (block ack procedures; clause from memory).
   */
  readonly blockAckReq: boolean;
}

export const DEFAULT_MAC_OPTIONS: MacOptions = Object.freeze({
  cipher: "CCMP-128",
  amsdu: 1,
  baWindow: null,
  ampduExponent: null,
  txopLimitUs: null,
  ap: false,
  aifsn: null,
  cwMin: null,
  cwMax: null,
  slotUs: null,
  basicRatesMbps: null,
  htc: false,
  retryLimit: null,
  muBar: false,
  tcp: false,
  tcpAckSegments: null,
  blockAckReq: false,
});

/** Rates a basic rate set may hold: Clause 15/16 DSSS/HR-DSSS and Clause 17/18 OFDM rates, Mb/s. */
export const NON_HT_RATES_Mbps: readonly MbPerSecond[] = [1, 2, 5.5, 6, 9, 11, 12, 18, 24, 36, 48, 54];

/**
 * Largest whole-number settings. TXOP: the TXOP Limit subfield is 8 bits in
 * units of 32 µs (IEEE 802.11-2020 9.4.2.28), so at most 255 × 32 µs.
 * AIFSN is a 4-bit subfield (9.4.2.28). ECWmin/ECWmax are 4-bit exponents,
 * CW = 2^ECW − 1 (9.4.2.28). BA window: the largest, EHT's 1024 (802.11be-2024).
 * A-MPDU exponent: the largest any family takes (EHT, aggregation.ts).
 * AMSDU: far above any A-MSDU that fits a family's length limit; the byte
 * limit is checked per link in frames.ts. RETRY: dot11ShortRetryLimit range
 * 1..255 (Annex C MIB, from memory).
 */
const TXOP_UNIT_us = 32;
export const TXOP_LIMIT_MAX_us: Microseconds = 255 * TXOP_UNIT_us;
const AIFSN_MAX = 15;
const ECW_MAX = 15;
const BA_WINDOW_MAX = 1024;
export const AMPDU_EXPONENT_MAX = 11;
const AMSDU_MAX = 64;
const RETRY_MAX = 255;
/** TCPACK: far above any receiver's ACK pacing (RFC 5681 asks for at least every second full-sized segment). */
const TCPACK_MAX = 64;

const VALID_TEXT =
  "use CCMP-128, CCMP-256, GCMP-128, GCMP-256, open, AMSDU=n, BA=n, AMPDU=n, TXOP=n, AP, AIFSN=n, CWMIN=n, CWMAX=n, SLOT=9|20, BASIC=6,12,24, HTC, RETRY=n, BAR, MUBAR, TCP or TCPACK=n";

type Mutable<T> = { -readonly [K in keyof T]: T[K] };

function wholeSetting(name: string, raw: string, min: number, max: number, unit = ""): number {
  const n = Number(raw);
  if (raw === "" || !Number.isInteger(n) || n < min || n > max) {
    invalid(`mac_options: ${name}= must be a whole number from ${min} to ${max}${unit ? " " + unit : ""}, got ${quoted(raw)}`);
  }
  return n;
}

/** A contention window value must be 2^ECW − 1 (9.4.2.28: CW = 2^ECW − 1, ECW 0..15). */
function contentionWindow(name: string, raw: string): number {
  const n = wholeSetting(name, raw, 0, 2 ** ECW_MAX - 1);
  if (!Number.isInteger(Math.log2(n + 1))) {
    invalid(`mac_options: ${name}= must be one less than a power of two (0, 1, 3, 7, 15, 31 … 32767), got ${n}`);
  }
  return n;
}

function basicRate(raw: string): MbPerSecond {
  const r = Number(raw);
  if (raw === "" || !NON_HT_RATES_Mbps.includes(r)) {
    invalid(`mac_options: BASIC= takes rates in Mb/s from ${NON_HT_RATES_Mbps.join(", ")}, got ${quoted(raw)}`);
  }
  return r;
}

function setOnce<K extends keyof MacOptions>(o: Mutable<MacOptions>, seen: Set<string>, key: K, value: MacOptions[K], token: string): void {
  if (seen.has(key)) invalid(`mac_options: ${quoted(token)} repeats a setting (each setting may appear once)`);
  seen.add(key);
  o[key] = value;
}

/** Parse mac_options text; null, undefined or "" give the defaults. */
export function parseMacOptions(text: unknown): MacOptions {
  // The common case — no options — stays a few bytes so callers inline it; the parser is out of line.
  if (isMissing(text)) return DEFAULT_MAC_OPTIONS;
  return parseMacOptionsText(text);
}

function parseMacOptionsText(text: unknown): MacOptions {
  if (typeof text === "object" && text !== null && "cipher" in text && "amsdu" in text) return text as MacOptions;
  if (typeof text !== "string") invalid(`mac_options: expected text such as "GCMP-256 AMSDU=2", got ${describe(text)}`);
  const o: Mutable<MacOptions> = { ...DEFAULT_MAC_OPTIONS };
  const seen = new Set<string>();
  let basic: MbPerSecond[] | null = null;
  for (const raw of text.split(/[\s,;]+/).filter((t) => t.length > 0)) {
    const t = raw.toUpperCase();
    // A bare number continues the BASIC= list that came just before it.
    if (basic !== null && /^[\d.]+$/.test(t)) {
      basic.push(basicRate(t));
      continue;
    }
    basic = null;
    const cipher = CIPHERS.find((c) => c.toUpperCase() === t);
    if (cipher) {
      setOnce(o, seen, "cipher", cipher, raw);
      continue;
    }
    if (t === "AP") { setOnce(o, seen, "ap", true, raw); continue; }
    if (t === "HTC") { setOnce(o, seen, "htc", true, raw); continue; }
    if (t === "MUBAR") { setOnce(o, seen, "muBar", true, raw); continue; }
    if (t === "TCP") { setOnce(o, seen, "tcp", true, raw); continue; }
    if (t === "BAR") { setOnce(o, seen, "blockAckReq", true, raw); continue; }
    const m = t.match(/^([A-Z]+)=(.*)$/);
    if (!m) invalid(`mac_options: unknown setting ${quoted(raw)}; ${VALID_TEXT}`);
    const [, key, value] = m;
    switch (key) {
      case "AMSDU": setOnce(o, seen, "amsdu", wholeSetting("AMSDU", value, 1, AMSDU_MAX, "MSDUs"), raw); break;
      case "BA": setOnce(o, seen, "baWindow", wholeSetting("BA", value, 1, BA_WINDOW_MAX, "MPDUs"), raw); break;
      case "AMPDU": setOnce(o, seen, "ampduExponent", wholeSetting("AMPDU", value, 0, AMPDU_EXPONENT_MAX), raw); break;
      case "TXOP": setOnce(o, seen, "txopLimitUs", wholeSetting("TXOP", value, 0, TXOP_LIMIT_MAX_us, "µs"), raw); break;
      case "AIFSN": setOnce(o, seen, "aifsn", wholeSetting("AIFSN", value, 1, AIFSN_MAX), raw); break;
      case "CWMIN": setOnce(o, seen, "cwMin", contentionWindow("CWMIN", value), raw); break;
      case "CWMAX": setOnce(o, seen, "cwMax", contentionWindow("CWMAX", value), raw); break;
      case "RETRY": setOnce(o, seen, "retryLimit", wholeSetting("RETRY", value, 1, RETRY_MAX, "attempts"), raw); break;
      case "TCPACK": setOnce(o, seen, "tcpAckSegments", wholeSetting("TCPACK", value, 1, TCPACK_MAX, "segments"), raw); break;
      case "SLOT": {
        if (value !== "9" && value !== "20") invalid(`mac_options: SLOT= must be 9 or 20 (µs), got ${quoted(value)}`);
        setOnce(o, seen, "slotUs", Number(value) as 9 | 20, raw);
        break;
      }
      case "BASIC": {
        basic = value === "" ? [] : [basicRate(value)];
        setOnce(o, seen, "basicRatesMbps", basic, raw);
        break;
      }
      default:
        invalid(`mac_options: unknown setting ${quoted(raw)}; ${VALID_TEXT}`);
    }
  }
  if (o.basicRatesMbps !== null) {
    if (o.basicRatesMbps.length === 0) invalid(`mac_options: BASIC= needs at least one rate, e.g. BASIC=6,12,24`);
    o.basicRatesMbps = [...new Set(o.basicRatesMbps)].sort((a, b) => a - b);
  }
  if (o.tcpAckSegments !== null && !o.tcp) invalid(`mac_options: TCPACK=${o.tcpAckSegments} sets the TCP acknowledgement pacing; add TCP to count the acknowledgements`);
  if (o.aifsn === 1 && !o.ap) invalid(`mac_options: AIFSN=1 is for an AP only (a non-AP station uses AIFSN 2 or more); add AP or use AIFSN=2…15`);
  if (o.cwMin !== null && o.cwMax !== null && o.cwMin > o.cwMax) {
    invalid(`mac_options: CWMIN=${o.cwMin} is above CWMAX=${o.cwMax}; CWmin must not exceed CWmax`);
  }
  return Object.freeze(o);
}
