/**
 * DSSS and HR/DSSS PHYs, 2.4 GHz only:
 * - DSSS, IEEE 802.11-2020 Clause 15: 1 Mb/s (DBPSK) and 2 Mb/s (DQPSK),
 *   long PPDU format only.
 * - HR/DSSS, IEEE 802.11-2020 Clause 16: adds 5.5 and 11 Mb/s (CCK) and the
 *   optional short PPDU format. The optional PBCC modulation (16.4) is not
 *   modelled: every rate here is the mandatory DBPSK/DQPSK/CCK one, so the
 *   PBCC term of the TXTIME equation is 0.
 *
 * Both use the same TXTIME equation (Clause 15 and Clause 16 PLME TXTIME
 * calculation; subclause numbers 15.3.x / 16.3.4 from memory):
 *   TXTIME = PreambleLength + PLCPHeaderTime + Ceiling((LENGTH × 8) ÷ DATARATE)  µs
 * with LENGTH the PSDU length in octets and DATARATE in Mb/s.
 */
import type { Link } from "../link";
import type { Bytes, Dbm, MbPerSecond, Microseconds } from "../units";
import type { PhyFamily, TxTime } from "./types";
import { invalid } from "../errors";
import { integerInRange } from "../args";
import { durationTerm, factorTerm, txtimeFromTerms } from "./_lib";

/** A PLCP field by the standard's name, its length in bits and the rate it is sent at, Mb/s. */
type PlcpField = readonly [name: string, bits: number, rateMbps: MbPerSecond];

/**
 * Long PPDU (Clause 15.2.3 / 16.2.2.2): SYNC 128 bits + SFD 16 bits, then the
 * header SIGNAL 8 + SERVICE 8 + LENGTH 16 + CRC 16 bits, all at 1 Mb/s DBPSK.
 */
const LONG_PREAMBLE: readonly PlcpField[] = [["SYNC", 128, 1], ["SFD", 16, 1]];
const LONG_HEADER: readonly PlcpField[] = [["SIGNAL", 8, 1], ["SERVICE", 8, 1], ["LENGTH", 16, 1], ["CRC", 16, 1]];
/**
 * Short PPDU (16.2.2.3): SYNC 56 bits + SFD 16 bits at 1 Mb/s DBPSK, then the
 * same 48-bit header at 2 Mb/s DQPSK.
 */
const SHORT_PREAMBLE: readonly PlcpField[] = [["SYNC", 56, 1], ["SFD", 16, 1]];
const SHORT_HEADER: readonly PlcpField[] = [["SIGNAL", 8, 2], ["SERVICE", 8, 2], ["LENGTH", 16, 2], ["CRC", 16, 2]];

/** Air time of a list of PLCP fields, µs (bits ÷ Mb/s = µs). */
function fieldsUs(fields: readonly PlcpField[]): Microseconds {
  let us = 0;
  for (const [, bits, rate] of fields) us += bits / rate;
  return us;
}

/** PLCP preamble, long format: 144 µs (16.2.2.2). */
export const LONG_PREAMBLE_us: Microseconds = fieldsUs(LONG_PREAMBLE);
/** PLCP header, long format: 48 µs (16.2.2.2). */
export const LONG_HEADER_us: Microseconds = fieldsUs(LONG_HEADER);
/** PLCP preamble, short format: 72 µs (16.2.2.3). */
export const SHORT_PREAMBLE_us: Microseconds = fieldsUs(SHORT_PREAMBLE);
/** PLCP header, short format: 24 µs (16.2.2.3). */
export const SHORT_HEADER_us: Microseconds = fieldsUs(SHORT_HEADER);

/**
 * aPSDUMaxLength, octets: 4095 for both Clause 15 (DSSS PHY characteristics
 * table) and Clause 16 (HR/DSSS PHY characteristics table). Value from memory.
 */
export const aPSDUMaxLength_DSSS: Bytes = 4095;

/** Clause 15 data rates, Mb/s (15.1: 1 Mb/s DBPSK, 2 Mb/s DQPSK). */
const DSSS_RATES: readonly MbPerSecond[] = [1, 2];
/** Clause 16 data rates, Mb/s (16.1: the Clause 15 rates plus 5.5 and 11 Mb/s CCK). */
const HR_DSSS_RATES: readonly MbPerSecond[] = [1, 2, 5.5, 11];
/** Rates the short PPDU can carry (16.2.2.3: the short header is sent at 2 Mb/s, the PSDU at 2, 5.5 or 11 Mb/s). */
const SHORT_PREAMBLE_RATES: readonly MbPerSecond[] = [2, 5.5, 11];

/**
 * Minimum input sensitivity, dBm (FER < 8 % with 1024-octet PSDUs):
 * - Clause 15 receiver minimum input level sensitivity: −80 dBm, specified
 *   at 2 Mb/s DQPSK. Used for 1 Mb/s too: DBPSK is the more robust of the
 *   two, so the 2 Mb/s figure is the conservative bound.
 * - Clause 16 (16.3.8.x, from memory): −76 dBm, specified at 11 Mb/s CCK
 *   only. Our choice for the other HR/DSSS rates: 5.5 Mb/s CCK takes the
 *   11 Mb/s figure (the clause states no other; 5.5 Mb/s is the more robust,
 *   so −76 dBm is conservative), and 1 and 2 Mb/s take the Clause 15 figure,
 *   because at those rates an HR/DSSS PHY sends the Clause 15 DBPSK/DQPSK
 *   modulation that the −80 dBm requirement was written for.
 */
const DSSS_SENSITIVITY_dBm: Dbm = -80;
const CCK_SENSITIVITY_dBm: Dbm = -76;

/** "1, 2, 5.5 or 11" */
function listOr(values: readonly number[]): string {
  return values.length === 1 ? String(values[0]) : `${values.slice(0, -1).join(", ")} or ${values[values.length - 1]}`;
}

/** PSDU air time, µs: Ceiling(LENGTH × 8 ÷ DATARATE). Doubled to integers so 5.5 Mb/s divides exactly. */
function psduUs(psduBytes: Bytes, rateMbps: MbPerSecond): Microseconds {
  return Math.ceil((16 * psduBytes) / (2 * rateMbps));
}

/** What differs between Clause 15 and Clause 16. */
interface DsssSpec {
  readonly family: "DSSS" | "HR-DSSS";
  readonly rates: readonly MbPerSecond[];
  readonly shortRates: readonly MbPerSecond[];
}

function validateDsss(spec: DsssSpec, link: Link): void {
  const f = spec.family;
  const rate = link.rateMbps;
  if (rate === null || !spec.rates.includes(rate)) {
    const hint = rate !== null && [6, 9, 12, 18, 24, 36, 48, 54].includes(rate) ? `; ${rate} Mb/s at 2.4 GHz is ERP-OFDM` : "";
    invalid(`link: ${f} has no ${rate} Mb/s rate; use ${listOr(spec.rates)}${hint}`);
  }
  if (link.bandGHz !== 2.4) invalid(`link: ${f} is defined only in the 2.4 GHz band, got ${link.bandGHz}GHz; use 2.4GHz`);
  if (link.widthMHz !== 20 || link.streams !== 1) invalid(`link: ${f} has one 20 MHz channel and one spatial stream`);
  if (link.preamble === "short" && !spec.shortRates.includes(rate)) {
    if (spec.shortRates.length === 0) {
      invalid(`link: ${f} (Clause 15) has only the long preamble; the short preamble is HR-DSSS at ${listOr(SHORT_PREAMBLE_RATES)} Mb/s`);
    }
    invalid(`link: ${f} short preamble is not defined at ${rate} Mb/s; use long, or ${listOr(spec.shortRates)} Mb/s with short`);
  }
}

function txtimeDsss(link: Link, psduBytes: Bytes): TxTime {
  const rate = link.rateMbps!;
  const short = link.preamble === "short";
  return txtimeFromTerms([
    durationTerm("PLCP preamble", short ? SHORT_PREAMBLE_us : LONG_PREAMBLE_us),
    durationTerm("PLCP header", short ? SHORT_HEADER_us : LONG_HEADER_us),
    factorTerm("data rate (Mb/s)", rate),
    factorTerm("PSDU bits", 8 * psduBytes),
    durationTerm("PSDU", psduUs(psduBytes, rate)),
  ]);
}

function sensitivityDsss(link: Link): Dbm {
  return link.rateMbps === 5.5 || link.rateMbps === 11 ? CCK_SENSITIVITY_dBm : DSSS_SENSITIVITY_dBm;
}

function makeFamily(spec: DsssSpec): PhyFamily {
  return {
    family: spec.family,
    mcsValues: spec.rates,
    validate: (link) => validateDsss(spec, link),
    rateMbps: (link) => link.rateMbps!,
    txtime: txtimeDsss,
    maxPsduBytes: () => aPSDUMaxLength_DSSS,
    sensitivityDbm: sensitivityDsss,
    // Non-HT PHY: the control response rate is chosen against the data rate itself (10.6.6.5).
    nonHtReferenceRateMbps: (link) => link.rateMbps!,
  };
}

/** DSSS, Clause 15: 1 and 2 Mb/s, long preamble only. */
export const dsss: PhyFamily = makeFamily({ family: "DSSS", rates: DSSS_RATES, shortRates: [] });
/** HR/DSSS, Clause 16: 1, 2, 5.5 and 11 Mb/s; short preamble at 2, 5.5 and 11 Mb/s. */
export const hrDsss: PhyFamily = makeFamily({ family: "HR-DSSS", rates: HR_DSSS_RATES, shortRates: SHORT_PREAMBLE_RATES });

/** The LENGTH field is 16 bits (16.2.3.5). */
const LENGTH_FIELD_MAX = 0xffff;

function hrDsssRate(rateMbps: unknown): MbPerSecond {
  if (typeof rateMbps !== "number" || !HR_DSSS_RATES.includes(rateMbps)) {
    invalid(`rate_mbps: HR-DSSS has rates ${listOr(HR_DSSS_RATES)} Mb/s, got ${String(rateMbps)}`);
  }
  return rateMbps;
}

/** The PLCP LENGTH field and the length extension bit of an HR/DSSS PPDU. */
export interface HrDsssLength {
  /** LENGTH: the PSDU's transmit time, µs (16 bits). */
  readonly lengthUs: number;
  /** SERVICE field bit b7: 1 when LENGTH alone would over-count the octets at 11 Mb/s. */
  readonly lengthExtension: 0 | 1;
}

/**
 * LENGTH field and length extension bit (IEEE 802.11-2020 16.2.3.5, the
 * LENGTH calculation; subclause number from memory). LENGTH is the PSDU time
 * in whole µs, Ceiling(octets × 8 ÷ R). At 11 Mb/s one µs carries less than
 * one octet, so two octet counts can share a LENGTH; the receiver computes
 * octets = Floor(LENGTH × 11 ÷ 8) − extension, and the transmitter sets the
 * extension bit when (LENGTH − octets × 8 ÷ 11) ≥ 8 ÷ 11. At 1, 2 and 5.5
 * Mb/s one µs carries at most one octet, so the bit is always 0 (PBCC, which
 * would add an octet to the count, is not modelled).
 *
 * Example: hrDsssLengthField(1026, 11) → { lengthUs: 747, lengthExtension: 1 }.
 */
export function hrDsssLengthField(psduBytes: unknown, rateMbps: unknown): HrDsssLength {
  const rate = hrDsssRate(rateMbps);
  const octets = integerInRange("psdu_bytes", psduBytes, 0, aPSDUMaxLength_DSSS, "octets");
  const lengthUs = psduUs(octets, rate);
  if (rate !== 11) return { lengthUs, lengthExtension: 0 };
  // (LENGTH − 8·octets/11) ≥ 8/11, multiplied through by 11 to stay in integers.
  return { lengthUs, lengthExtension: 11 * lengthUs - 8 * octets >= 8 ? 1 : 0 };
}

/**
 * The receiver's side of the same calculation (16.2.3.5): PSDU octets from
 * LENGTH, the extension bit and the rate. Floor(LENGTH × R ÷ 8) − extension.
 */
export function hrDsssOctetsFromLength(lengthUs: unknown, lengthExtension: unknown, rateMbps: unknown): Bytes {
  const rate = hrDsssRate(rateMbps);
  const us = integerInRange("length_us", lengthUs, 0, LENGTH_FIELD_MAX, "µs");
  if (lengthExtension !== 0 && lengthExtension !== 1) invalid(`length_extension: must be 0 or 1, got ${String(lengthExtension)}`);
  const octets = Math.floor((us * 2 * rate) / 16) - lengthExtension;
  if (octets < 0) invalid(`length_extension: 1 with LENGTH 0 µs describes no PSDU; use 0`);
  return octets;
}
