/**
 * The control response rate and the non-HT PPDU that carries control frames
 * (RTS, CTS, Ack, BlockAck). IEEE 802.11-2020 10.6.6.5 (rate selection for
 * control response frames; subclause number from memory):
 * - the response goes at the highest rate of the BSS basic rate set that is
 *   not above the eliciting frame's rate — for an HT, VHT, HE or EHT PPDU the
 *   non-HT reference rate of its MCS — and of the same modulation class
 *   (DSSS/HR-DSSS answers DSSS/HR-DSSS; OFDM answers every OFDM-based PPDU);
 * - when no basic rate qualifies, the highest mandatory rate of that class
 *   not above the eliciting rate.
 * The response PPDU is non-HT: ERP-OFDM in the 2.4 GHz band (so it carries the
 * 6 µs signal extension), OFDM at 5 and 6 GHz, DSSS/HR-DSSS for DSSS rates.
 * Its duration comes from the PHY's own TXTIME via link text, so the PHY
 * equations live in one place.
 *
 * RTS and CTS-to-self are sent at the same rate here. The standard lets the
 * initiator pick any basic rate; the response rate is the common choice
 * (common practice).
 */
import { invalid } from "../errors";
import type { Link } from "../link";
import type { MbPerSecond } from "../units";
import { nonHtReferenceRateMbps } from "../phy";
import type { MacOptions } from "./options";

export type ModulationClass = "DSSS" | "OFDM";

/** DSSS/HR-DSSS rates, Mb/s (Clauses 15 and 16). */
const DSSS_CLASS_RATES: readonly MbPerSecond[] = [1, 2, 5.5, 11];
/** Mandatory rates, Mb/s: Clause 15 DSSS 1 and 2; Clause 16 adds 5.5 and 11; Clause 17/18 OFDM 6, 12 and 24 (17.3.? "mandatory", from memory). */
const MANDATORY_DSSS: readonly MbPerSecond[] = [1, 2];
const MANDATORY_HR_DSSS: readonly MbPerSecond[] = [1, 2, 5.5, 11];
const MANDATORY_OFDM: readonly MbPerSecond[] = [6, 12, 24];
/** Default basic rate sets (DESIGN.md §2): 1 and 2 Mb/s on DSSS/HR-DSSS, 6/12/24 Mb/s on OFDM-based PHYs. */
const DEFAULT_BASIC_DSSS: readonly MbPerSecond[] = [1, 2];

export function modulationClass(link: Link): ModulationClass {
  return link.family === "DSSS" || link.family === "HR-DSSS" ? "DSSS" : "OFDM";
}

function inClass(cls: ModulationClass, rate: MbPerSecond): boolean {
  return DSSS_CLASS_RATES.includes(rate) === (cls === "DSSS");
}

/** Mandatory rates of the link's modulation class, ascending. */
export function mandatoryRates(link: Link): readonly MbPerSecond[] {
  if (link.family === "DSSS") return MANDATORY_DSSS;
  if (link.family === "HR-DSSS") return MANDATORY_HR_DSSS;
  return MANDATORY_OFDM;
}

/** The basic rate set that applies to this link's modulation class, ascending. */
export function basicRates(link: Link, options: MacOptions): readonly MbPerSecond[] {
  const cls = modulationClass(link);
  if (options.basicRatesMbps === null) return cls === "DSSS" ? DEFAULT_BASIC_DSSS : MANDATORY_OFDM;
  if (link.bandGHz !== 2.4) {
    const dsss = options.basicRatesMbps.filter((r) => DSSS_CLASS_RATES.includes(r));
    if (dsss.length > 0) {
      invalid(`mac_options: BASIC= holds ${dsss.join(", ")} Mb/s, DSSS/HR-DSSS rates that exist only at 2.4 GHz; at ${link.bandGHz} GHz use OFDM rates (6, 9, 12, 18, 24, 36, 48, 54)`);
    }
  }
  return options.basicRatesMbps.filter((r) => inClass(cls, r));
}

/** Control response rate for frames elicited by this link's data, Mb/s. */
export function controlRateMbps(link: Link, options: MacOptions): MbPerSecond {
  const reference = nonHtReferenceRateMbps(link);
  const notAbove = (rates: readonly MbPerSecond[]) => rates.filter((r) => r <= reference);
  const basic = notAbove(basicRates(link, options));
  if (basic.length > 0) return basic[basic.length - 1];
  const mandatory = notAbove(mandatoryRates(link));
  // Every link's reference rate is at least its class's lowest mandatory rate (1 or 6 Mb/s).
  return mandatory.length > 0 ? mandatory[mandatory.length - 1] : mandatoryRates(link)[0];
}

/**
 * Link text of the non-HT PPDU that carries a control frame at `rateMbps`
 * in the link's band. A DSSS-class response keeps the eliciting frame's
 * short preamble where the rate allows it (not at 1 Mb/s, 16.2.2.3).
 */
export function controlLinkText(link: Link, rateMbps: MbPerSecond): string {
  if (DSSS_CLASS_RATES.includes(rateMbps)) {
    const family = rateMbps <= 2 ? "DSSS" : "HR-DSSS";
    const short = link.preamble === "short" && rateMbps !== 1 ? " short" : "";
    // A 2 Mb/s short-preamble PPDU is an HR/DSSS format (16.2.2.3).
    const fam = short ? "HR-DSSS" : family;
    return `${fam} ${rateMbps}Mbps${short} 2.4GHz`;
  }
  return link.bandGHz === 2.4 ? `ERP-OFDM ${rateMbps}Mbps 2.4GHz` : `OFDM ${rateMbps}Mbps ${link.bandGHz}GHz`;
}
