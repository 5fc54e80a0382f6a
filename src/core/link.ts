/**
 * Link text (DESIGN.md §3): one cell of text describes one PHY configuration.
 *
 *   <family> MCS<n> <k>SS <w>MHz GI<g> [<options>] <band>GHz   HE MCS9 2SS 80MHz GI0.8 5GHz
 *   <family> <rate>Mbps [short|long] <band>GHz                 ERP-OFDM 54Mbps 2.4GHz
 *
 * Tokens are space separated, in any order, case-insensitive. Parsing fills
 * every default, asks the family module whether the standard allows the
 * result, and caches the answer so a sheet that repeats one link cell pays for
 * the parse once.
 */
import { AirtallyError, invalid } from "./errors";
import { describe, isMissing, quoted } from "./args";
import type { GHz, MHz, MbPerSecond, Microseconds } from "./units";
import { familyModule } from "./phy/registry";
import { BoundedMemo } from "./memo";

export const FAMILIES = ["DSSS", "HR-DSSS", "OFDM", "ERP-OFDM", "HT", "VHT", "HE", "EHT"] as const;
export type Family = (typeof FAMILIES)[number];
export type BandGHz = 2.4 | 5 | 6;
export type Coding = "BCC" | "LDPC";

/** Families whose rate is given in Mb/s rather than as an MCS index (non-HT PHYs). */
export const NON_HT_FAMILIES: readonly Family[] = ["DSSS", "HR-DSSS", "OFDM", "ERP-OFDM"];

export interface Link {
  readonly family: Family;
  readonly bandGHz: BandGHz;
  /** Non-HT PHYs: the data rate, Mb/s. Null for HT and later. */
  readonly rateMbps: MbPerSecond | null;
  /** DSSS/HR-DSSS PLCP preamble; null for OFDM-based PHYs. */
  readonly preamble: "long" | "short" | null;
  /** HT: the HT MCS index (0–76); VHT/HE/EHT: the per-stream MCS. Null for non-HT. */
  readonly mcs: number | null;
  /** Spatial streams N_SS (1 for non-HT). */
  readonly streams: number;
  /** Channel width, MHz (20 for non-HT). */
  readonly widthMHz: MHz;
  /** Guard interval, µs; null for non-HT. */
  readonly giUs: Microseconds | null;
  /** FEC coding; null for non-HT. */
  readonly coding: Coding | null;
  /** Space-time block coding (N_STS = 2 × N_SS). */
  readonly stbc: boolean;
  /** HT greenfield format (HT only). */
  readonly greenfield: boolean;
  /** HE-LTF / EHT-LTF size (1x, 2x, 4x); null before HE. */
  readonly ltf: 1 | 2 | 4 | null;
  /** Receiver's nominal packet padding, µs (HE/EHT); null before HE. */
  readonly nominalPaddingUs: 0 | 8 | 16 | null;
  /** HE extended range SU PPDU. */
  readonly extendedRange: boolean;
  /** One user's resource unit in tones (26…996, 1992 for 2×996); null = the whole channel, SU. */
  readonly ruTones: number | null;
  /** HE/EHT dual carrier modulation. */
  readonly dcm: boolean;
  /** The canonical text of this link (formatLink). */
  readonly text: string;
}

type MutableLink = { -readonly [K in keyof Link]: Link[K] };

const VALID_FAMILIES_TEXT = "DSSS, HR-DSSS, OFDM, ERP-OFDM, HT, VHT, HE or EHT";
const RU_TOKENS: Record<string, number> = {
  RU26: 26, RU52: 52, RU106: 106, RU242: 242, RU484: 484, RU996: 996, RU2X996: 1992,
};
const RU_NAMES: Record<number, string> = {
  26: "RU26", 52: "RU52", 106: "RU106", 242: "RU242", 484: "RU484", 996: "RU996", 1992: "RU2x996",
};

/** What the tokens said, before defaults. */
interface LinkSpec {
  family?: Family;
  rateMbps?: number;
  preamble?: "long" | "short";
  mcs?: number;
  streams?: number;
  widthMHz?: number;
  giUs?: number;
  bandGHz?: number;
  coding?: Coding;
  stbc?: boolean;
  format?: "MF" | "GF";
  ltf?: 1 | 2 | 4;
  nominalPaddingUs?: 0 | 8 | 16;
  ppdu?: "SU" | "ER";
  ruTones?: number;
  dcm?: boolean;
}

/** What each setting is called in messages: the user's words, never a field name. */
const SETTING_NAMES: Readonly<Record<keyof LinkSpec, string>> = {
  family: "the PHY family",
  rateMbps: "the data rate (Mbps)",
  preamble: "the preamble (short/long)",
  mcs: "the MCS (MCS<n>)",
  streams: "the spatial streams (<k>SS)",
  widthMHz: "the channel width (<w>MHz)",
  giUs: "the guard interval (GI, SGI or LGI)",
  bandGHz: "the band (<band>GHz)",
  coding: "the coding (BCC/LDPC)",
  stbc: "STBC",
  format: "the HT format (MF/GF)",
  ltf: "the LTF size (1xLTF/2xLTF/4xLTF)",
  nominalPaddingUs: "the packet extension (PE0/PE8/PE16)",
  ppdu: "the PPDU format (SU/ER)",
  ruTones: "the resource unit (RU…)",
  dcm: "DCM",
};

function repeated(token: string, key: keyof LinkSpec): never {
  invalid(`link: ${quoted(token)} repeats ${SETTING_NAMES[key]}; give each setting once`);
}

function setOnce<K extends keyof LinkSpec>(spec: LinkSpec, key: K, value: LinkSpec[K], token: string): void {
  if (spec[key] !== undefined) repeated(token, key);
  spec[key] = value;
}

/** Read one token into the spec; unknown tokens are an error that lists the grammar. */
function readToken(spec: LinkSpec, raw: string): void {
  // µ (micro sign) and μ (Greek mu) both mean micro; upper-casing would turn them into Greek capital mu.
  const t = raw.replace(/[µμ]/g, "u").toUpperCase();
  const family = FAMILIES.find((f) => f === t);
  if (family) return setOnce(spec, "family", family, raw);
  let m: RegExpMatchArray | null;
  if ((m = t.match(/^MCS(\d{1,3})$/))) return setOnce(spec, "mcs", Number(m[1]), raw);
  if ((m = t.match(/^(\d{1,2})SS$/))) return setOnce(spec, "streams", Number(m[1]), raw);
  if ((m = t.match(/^(\d{1,3})MHZ$/))) return setOnce(spec, "widthMHz", Number(m[1]), raw);
  if ((m = t.match(/^(\d+(?:\.\d+)?)GHZ$/))) return setOnce(spec, "bandGHz", Number(m[1]), raw);
  if ((m = t.match(/^(\d+(?:\.\d+)?)(?:MBPS|MB\/S)$/))) return setOnce(spec, "rateMbps", Number(m[1]), raw);
  if ((m = t.match(/^GI(\d+(?:\.\d+)?)(?:US)?$/))) return setOnce(spec, "giUs", Number(m[1]), raw);
  if ((m = t.match(/^GI(\d+)NS$/))) return setOnce(spec, "giUs", Number(m[1]) / 1000, raw);
  if (t === "SGI") return setOnce(spec, "giUs", 0.4, raw);
  if (t === "LGI") return setOnce(spec, "giUs", 0.8, raw);
  if (t === "BCC" || t === "LDPC") return setOnce(spec, "coding", t, raw);
  if (t === "STBC") return setOnce(spec, "stbc", true, raw);
  if (t === "GF" || t === "MF") return setOnce(spec, "format", t, raw);
  if ((m = t.match(/^([124])XLTF$/))) return setOnce(spec, "ltf", Number(m[1]) as 1 | 2 | 4, raw);
  if ((m = t.match(/^PE(0|8|16)$/))) return setOnce(spec, "nominalPaddingUs", Number(m[1]) as 0 | 8 | 16, raw);
  if (t === "SU" || t === "ER") return setOnce(spec, "ppdu", t, raw);
  if (t in RU_TOKENS) return setOnce(spec, "ruTones", RU_TOKENS[t], raw);
  if (t === "DCM") return setOnce(spec, "dcm", true, raw);
  if (t === "SHORT" || t === "LONG") return setOnce(spec, "preamble", t === "SHORT" ? "short" : "long", raw);
  if (/^[A-Z]/.test(t) && !/\d/.test(t) && t.length <= 8 && /^[A-Z-]+$/.test(t)) {
    invalid(`link: unknown family ${quoted(raw)}; use ${VALID_FAMILIES_TEXT}`);
  }
  invalid(
    `link: unknown token ${quoted(raw)}; expected a family (${VALID_FAMILIES_TEXT}), MCS<n>, <k>SS, <w>MHz, ` +
      `GI<g>, <band>GHz, <rate>Mbps or an option (LDPC, BCC, STBC, GF, 1xLTF/2xLTF/4xLTF, PE0/PE8/PE16, ER, RU26…RU2x996, DCM, short, long)`,
  );
}

function isNonHt(family: Family): boolean {
  return NON_HT_FAMILIES.includes(family);
}

/** Complain about a token that the family does not use. */
function refuseFor(family: Family, present: unknown, what: string, validFor: string): void {
  if (present !== undefined) invalid(`link: ${what} does not apply to ${family}; it is for ${validFor}`);
}

/** Fill defaults (DESIGN.md §3) and build the Link; the family module validates it afterwards. */
function completeSpec(spec: LinkSpec): MutableLink {
  const family = spec.family;
  if (!family) invalid(`link: no PHY family; start with one of ${VALID_FAMILIES_TEXT} (e.g. "HE MCS9 2SS 80MHz")`);
  const module = familyModule(family);
  const nonHt = isNonHt(family);
  const heOrLater = family === "HE" || family === "EHT";

  if (nonHt) {
    refuseFor(family, spec.mcs, "an MCS index", "HT, VHT, HE and EHT; give the rate as <rate>Mbps");
    refuseFor(family, spec.giUs, "a guard interval", "HT, VHT, HE and EHT");
    refuseFor(family, spec.coding, "BCC/LDPC", "HT, VHT, HE and EHT");
    refuseFor(family, spec.stbc, "STBC", "HT, VHT and HE");
    if (spec.rateMbps === undefined) invalid(`link: ${family} needs a data rate such as ${exampleRate(family)}`);
    if (spec.streams !== undefined && spec.streams !== 1) invalid(`link: ${family} has one spatial stream, got ${spec.streams}SS`);
    if (spec.widthMHz !== undefined && spec.widthMHz !== 20) invalid(`link: ${family} uses 20 MHz channels, got ${spec.widthMHz}MHz`);
  } else {
    refuseFor(family, spec.rateMbps, "a rate in Mb/s", "DSSS, HR-DSSS, OFDM and ERP-OFDM; give MCS<n> instead");
    if (spec.mcs === undefined) invalid(`link: ${family} needs an MCS index such as MCS7`);
  }
  if (family !== "DSSS" && family !== "HR-DSSS") refuseFor(family, spec.preamble, "a short/long preamble", "DSSS and HR-DSSS");
  if (family !== "HT") refuseFor(family, spec.format, "GF/MF (HT format)", "HT");
  if (!heOrLater) {
    refuseFor(family, spec.ltf, "an LTF size", "HE and EHT");
    refuseFor(family, spec.nominalPaddingUs, "a packet extension (PE)", "HE and EHT");
    refuseFor(family, spec.ruTones, "a resource unit", "HE and EHT");
    refuseFor(family, spec.dcm, "DCM", "HE and EHT");
    refuseFor(family, spec.ppdu, "SU/ER", "HE");
  }

  const defaultBand: BandGHz = family === "DSSS" || family === "HR-DSSS" || family === "ERP-OFDM" ? 2.4 : 5;
  const band = spec.bandGHz ?? defaultBand;
  if (band !== 2.4 && band !== 5 && band !== 6) invalid(`link: band must be 2.4GHz, 5GHz or 6GHz, got ${band}GHz`);

  let streams = spec.streams ?? 1;
  if (module.impliedStreams && spec.mcs !== undefined) {
    const implied = module.impliedStreams(spec.mcs);
    if (spec.streams !== undefined && spec.streams !== implied) {
      invalid(`link: HT MCS${spec.mcs} carries ${implied} spatial stream(s), not ${spec.streams}SS; drop the SS token or fix it`);
    }
    streams = implied;
  }
  const giUs = nonHt ? null : spec.giUs ?? 0.8;
  const defaultLtf: 1 | 2 | 4 = giUs === 3.2 ? 4 : 2;
  return {
    family,
    bandGHz: band as BandGHz,
    rateMbps: nonHt ? spec.rateMbps! : null,
    preamble: family === "DSSS" || family === "HR-DSSS" ? spec.preamble ?? "long" : null,
    mcs: nonHt ? null : spec.mcs!,
    streams,
    widthMHz: spec.widthMHz ?? 20,
    giUs,
    coding: nonHt ? null : spec.coding ?? (heOrLater ? "LDPC" : "BCC"),
    stbc: spec.stbc ?? false,
    greenfield: spec.format === "GF",
    ltf: heOrLater ? spec.ltf ?? defaultLtf : null,
    nominalPaddingUs: heOrLater ? spec.nominalPaddingUs ?? 16 : null,
    extendedRange: spec.ppdu === "ER",
    ruTones: spec.ruTones ?? null,
    dcm: spec.dcm ?? false,
    text: "",
  };
}

function exampleRate(family: Family): string {
  return family === "DSSS" ? "2Mbps" : family === "HR-DSSS" ? "11Mbps" : "54Mbps";
}

/** Canonical text (DESIGN.md §3): defaults that go without saying are left out. */
export function formatLink(link: Omit<Link, "text">): string {
  const parts: string[] = [link.family];
  if (link.rateMbps !== null) {
    parts.push(`${link.rateMbps}Mbps`);
    if (link.preamble === "short") parts.push("short");
  } else {
    parts.push(`MCS${link.mcs}`, `${link.streams}SS`, `${link.widthMHz}MHz`, `GI${link.giUs}`);
    if (link.greenfield) parts.push("GF");
    if (link.extendedRange) parts.push("ER");
    if (link.ruTones !== null) parts.push(RU_NAMES[link.ruTones]);
    if (link.ltf !== null && link.ltf !== (link.giUs === 3.2 ? 4 : 2)) parts.push(`${link.ltf}xLTF`);
    if (link.nominalPaddingUs !== null && link.nominalPaddingUs !== 16) parts.push(`PE${link.nominalPaddingUs}`);
    if (link.dcm) parts.push("DCM");
    const defaultCoding = link.family === "HE" || link.family === "EHT" ? "LDPC" : "BCC";
    if (link.coding !== defaultCoding) parts.push(link.coding!);
    if (link.stbc) parts.push("STBC");
  }
  parts.push(`${link.bandGHz}GHz`);
  return parts.join(" ");
}

/**
 * Bounded memo of parsed link text, by entries and by key characters
 * (memo.ts): 2048 texts of up to 128 characters each on average, no text
 * over 1024 characters (a canonical link is under 60).
 */
const parseCache = new BoundedMemo<Link | AirtallyError>("link text", 2048, 2048 * 128, 1024);

function parseUncached(text: string): Link {
  const tokens = text.split(/[\s,]+/).filter((t) => t.length > 0);
  if (tokens.length === 0) invalid(`link: empty; write a link such as "HE MCS9 2SS 80MHz 5GHz" or "OFDM 54Mbps 5GHz"`);
  const spec: LinkSpec = {};
  for (const token of tokens) readToken(spec, token);
  const link = completeSpec(spec);
  familyModule(link.family).validate(link);
  link.text = formatLink(link);
  return Object.freeze(link);
}

/** Parse link text into a validated Link; throws #VALUE! with a message naming what is valid. */
export function parseLink(text: unknown): Link {
  if (typeof text !== "string" || isMissing(text)) {
    invalid(`link: expected link text such as "HE MCS9 2SS 80MHz 5GHz", got ${describe(text)}`);
  }
  const cached = parseCache.get(text);
  if (cached !== undefined) {
    if (cached instanceof AirtallyError) throw cached;
    return cached;
  }
  let result: Link | AirtallyError;
  try {
    result = parseUncached(text);
  } catch (e) {
    if (!(e instanceof AirtallyError)) throw e;
    result = e;
  }
  parseCache.set(text, result);
  if (result instanceof AirtallyError) throw result;
  return result;
}

/** The canonical text of a link given as text. */
export function canonicalLink(text: unknown): string {
  return parseLink(text).text;
}

/** One LINK argument turned into link text, with the argument's name for error messages. */
interface ArgumentToken {
  readonly name: string;
  readonly text: string;
}

/** A LINK number argument: finite, in range, else #VALUE! naming the argument. */
function linkNumber(name: string, value: unknown, min: number, max: number, what: string): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value < min || value > max) {
    invalid(`${name}: expected ${what}, got ${describe(value)}`);
  }
  return value;
}

/**
 * Build a link from separate arguments (the LINK function). `mcs` is the rate
 * in Mb/s for non-HT families. Null arguments take the defaults; for HT an
 * omitted stream count is implied by the MCS index.
 *
 * The arguments become link text and go through the one parser, so LINK and
 * link text can never disagree. When the standard refuses the combination,
 * the message names the argument responsible: the first optional argument
 * (from the last) whose omission makes the link valid, else `mcs`.
 */
export function buildLink(
  family: unknown,
  mcs: unknown,
  streams: unknown,
  widthMHz: unknown,
  giUs: unknown,
  bandGHz: unknown,
  phyOptions: unknown,
): Link {
  if (typeof family !== "string" || isMissing(family)) invalid(`family: expected ${VALID_FAMILIES_TEXT}, got ${describe(family)}`);
  const fam = FAMILIES.find((f) => f === family.trim().toUpperCase());
  if (!fam) invalid(`family: unknown family ${quoted(family)}; use ${VALID_FAMILIES_TEXT}`);
  if (isMissing(mcs)) invalid(`mcs: required; the MCS index (or the rate in Mb/s for ${NON_HT_FAMILIES.join(", ")})`);
  const tokens: ArgumentToken[] = [];
  if (isNonHt(fam)) {
    tokens.push({ name: "mcs", text: `${linkNumber("mcs", mcs, 0, 1000, "the data rate in Mb/s of a non-HT family (e.g. 54)")}Mbps` });
  } else {
    const m = linkNumber("mcs", mcs, 0, 1000, "a whole MCS index");
    if (!Number.isInteger(m)) invalid(`mcs: must be a whole MCS index, got ${m}`);
    tokens.push({ name: "mcs", text: `MCS${m}` });
  }
  if (!isMissing(streams)) {
    const s = linkNumber("streams", streams, 1, 16, "a whole number of spatial streams from 1 to 16");
    if (!Number.isInteger(s)) invalid(`streams: must be a whole number of spatial streams from 1 to 16, got ${s}`);
    tokens.push({ name: "streams", text: `${s}SS` });
  }
  if (!isMissing(widthMHz)) {
    const w = linkNumber("width_mhz", widthMHz, 1, 1000, "20, 40, 80, 160 or 320");
    if (!Number.isInteger(w)) invalid(`width_mhz: must be 20, 40, 80, 160 or 320, got ${w}`);
    tokens.push({ name: "width_mhz", text: `${w}MHz` });
  }
  if (!isMissing(giUs)) tokens.push({ name: "gi_us", text: `GI${linkNumber("gi_us", giUs, 0.1, 10, "0.4, 0.8, 1.6 or 3.2 µs")}` });
  if (!isMissing(bandGHz)) tokens.push({ name: "band_ghz", text: `${linkNumber("band_ghz", bandGHz, 1, 100, "2.4, 5 or 6 GHz")}GHz` });
  if (!isMissing(phyOptions)) {
    if (typeof phyOptions !== "string") invalid(`phy_options: expected text such as "LDPC STBC", got ${describe(phyOptions)}`);
    tokens.push({ name: "phy_options", text: phyOptions });
  }
  const textOf = (list: readonly ArgumentToken[]) => [fam, ...list.map((t) => t.text)].join(" ");
  try {
    return parseLink(textOf(tokens));
  } catch (e) {
    if (!(e instanceof AirtallyError)) throw e;
    throw new AirtallyError(e.kind, e.message.replace(/^link:/, `${blamedArgument(tokens, textOf)}:`));
  }
}

/** The LINK argument a refusal comes from: the last optional one whose omission makes the link valid, else mcs. */
function blamedArgument(tokens: readonly ArgumentToken[], textOf: (list: readonly ArgumentToken[]) => string): string {
  for (let i = tokens.length - 1; i >= 1; i--) {
    try {
      parseLink(textOf(tokens.filter((_, k) => k !== i)));
      return tokens[i].name;
    } catch (e) {
      if (!(e instanceof AirtallyError)) throw e;
    }
  }
  return "mcs";
}
