/**
 * PHY timing characteristics the MAC uses (aSIFSTime, aSlotTime,
 * aRxPHYStartDelay, aCWmin, aCWmax, aPPDUMaxTime) and the interframe spaces
 * derived from them (IEEE 802.11-2020 10.3.2.3):
 *   PIFS = aSIFSTime + aSlotTime
 *   DIFS = aSIFSTime + 2 × aSlotTime
 *   AIFS[AC] = aSIFSTime + AIFSN[AC] × aSlotTime   (10.23.2.4, from memory)
 *   EIFS = aSIFSTime + DIFS + AckTxTime            (AckTxTime: an Ack at the lowest mandatory rate)
 *   AckTimeout = aSIFSTime + aSlotTime + aRxPHYStartDelay   (10.3.2.9)
 */
import { invalid } from "../errors";
import type { Link } from "../link";
import type { Microseconds } from "../units";
import { txtimeUs } from "../phy";
import type { MacOptions } from "./options";
import { ACK_octets } from "./frames";
import { controlLinkText, mandatoryRates } from "./response";

/** aSIFSTime at 2.4 GHz: DSSS/HR-DSSS (Clauses 15/16), ERP (Table 18-5), HT at 2.4 GHz (Table 19-25), HE at 2.4 GHz (802.11ax-2021 27.4.4, HE PHY characteristics table; from memory). */
export const aSIFSTime_2_4GHz_us: Microseconds = 10;
/** aSIFSTime of OFDM-based PHYs at 5 and 6 GHz: OFDM 20 MHz (Table 17-21), HT (Table 19-25), VHT (Table 21-28), HE/EHT. */
export const aSIFSTime_5GHz_us: Microseconds = 16;
/** aSlotTime of DSSS/HR-DSSS (Clause 15/16 PHY characteristics). */
export const aSlotTime_DSSS_us: Microseconds = 20;
/** aSlotTime of OFDM-based PHYs at 20 MHz spacing (Table 17-21), and the ERP/HT short slot at 2.4 GHz (Table 18-5). */
export const aSlotTime_short_us: Microseconds = 9;
/** The long slot of ERP and later PHYs at 2.4 GHz, used when DSSS stations share the BSS (Table 18-5). */
export const aSlotTime_long_us: Microseconds = aSlotTime_DSSS_us;

/** aPPDUMaxTime, 5484 µs: a PHY characteristic, defined in phy/_lib.ts (the PHY also derives its largest PSDU from it). */
export { aPPDUMaxTime_us } from "../phy/_lib";

/**
 * aRxPHYStartDelay, µs. OFDM 20 MHz: 25 (Table 17-21). The others from
 * memory: DSSS long PPDU 192, HR/DSSS short 96 (the preamble and header
 * times), ERP-OFDM 24 (Table 18-5), HT 33 (Table 19-25); VHT, HE and EHT are
 * taken as HT's 33 (not verified). Used only for AckTimeout, which no ACCESS
 * term depends on.
 */
function aRxPHYStartDelay_us(link: Link): Microseconds {
  switch (link.family) {
    case "DSSS":
    case "HR-DSSS":
      return link.preamble === "short" ? 96 : 192;
    case "OFDM":
      return 25;
    case "ERP-OFDM":
      return 24;
    default:
      return 33;
  }
}

/** aSIFSTime for the link's PHY and band. */
export function sifsUs(link: Link): Microseconds {
  return link.bandGHz === 2.4 ? aSIFSTime_2_4GHz_us : aSIFSTime_5GHz_us;
}

/**
 * aSlotTime for the link's PHY and band. DSSS/HR-DSSS: 20 µs. At 5/6 GHz:
 * 9 µs. ERP and later at 2.4 GHz: `SLOT=` — 9 µs (short slot) by default,
 * 20 µs when DSSS stations are present.
 */
export function slotUs(link: Link, options: MacOptions): Microseconds {
  const dsss = link.family === "DSSS" || link.family === "HR-DSSS";
  if (dsss) {
    if (options.slotUs === 9) invalid(`mac_options: SLOT=9 does not apply to ${link.family}, whose slot is ${aSlotTime_DSSS_us} µs; drop SLOT=`);
    return aSlotTime_DSSS_us;
  }
  if (link.bandGHz !== 2.4) {
    if (options.slotUs === 20) invalid(`mac_options: SLOT=20 is the 2.4 GHz long slot; at ${link.bandGHz} GHz the slot is ${aSlotTime_short_us} µs; drop SLOT=`);
    return aSlotTime_short_us;
  }
  return options.slotUs === 20 ? aSlotTime_long_us : aSlotTime_short_us;
}

export function pifsUs(link: Link, options: MacOptions): Microseconds {
  return sifsUs(link) + slotUs(link, options);
}

export function difsUs(link: Link, options: MacOptions): Microseconds {
  return sifsUs(link) + 2 * slotUs(link, options);
}

/** AIFS = aSIFSTime + AIFSN × aSlotTime. */
export function aifsFor(link: Link, options: MacOptions, aifsn: number): Microseconds {
  return sifsUs(link) + aifsn * slotUs(link, options);
}

/** An Ack at the lowest mandatory rate of the link's modulation class (1 Mb/s DSSS, 6 Mb/s OFDM), µs. */
export function ackTxTimeUs(link: Link): Microseconds {
  return txtimeUs(controlLinkText(link, mandatoryRates(link)[0]), ACK_octets);
}

/** EIFS = aSIFSTime + DIFS + AckTxTime (10.3.2.3.7). */
export function eifsUs(link: Link, options: MacOptions): Microseconds {
  return sifsUs(link) + difsUs(link, options) + ackTxTimeUs(link);
}

/** AckTimeout = aSIFSTime + aSlotTime + aRxPHYStartDelay (10.3.2.9). */
export function ackTimeoutUs(link: Link, options: MacOptions): Microseconds {
  return sifsUs(link) + slotUs(link, options) + aRxPHYStartDelay_us(link);
}

/** aCWmin: 31 for DSSS/HR-DSSS (Clause 15/16 characteristics), 15 for OFDM-based PHYs (Table 17-21, 18-5, 19-25, 21-28). */
export function aCWmin(link: Link): number {
  return link.family === "DSSS" || link.family === "HR-DSSS" ? 31 : 15;
}

/** aCWmax: 1023 for every PHY here (same tables). */
export function aCWmax(_link: Link): number {
  return 1023;
}
