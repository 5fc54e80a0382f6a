/**
 * Frame sizes, octets: data MPDUs with their security overhead, A-MSDU and
 * A-MPDU packing, and the control frames of one channel access.
 * IEEE Std 802.11-2020 clause 9 (frame formats) and 12.5 (CCMP, GCMP).
 */
import { invalid } from "../errors";
import { integerInRange } from "../args";
import type { Bytes } from "../units";
import { parseMacOptions, type Cipher, type MacOptions } from "./options";

// MAC header fields, octets (IEEE 802.11-2020 9.2.3, general frame format).
export const FRAME_CONTROL_octets: Bytes = 2;
export const DURATION_ID_octets: Bytes = 2;
export const ADDRESS_octets: Bytes = 6;
export const SEQUENCE_CONTROL_octets: Bytes = 2;
export const QOS_CONTROL_octets: Bytes = 2;
export const HT_CONTROL_octets: Bytes = 4;
export const FCS_octets: Bytes = 4;

/** Data frame header without QoS Control, three addresses (9.3.2.1): 2 + 2 + 3 × 6 + 2 = 24. */
export const DATA_HEADER_octets: Bytes = FRAME_CONTROL_octets + DURATION_ID_octets + 3 * ADDRESS_octets + SEQUENCE_CONTROL_octets;
/** QoS Data header (9.3.2.1): the data header plus QoS Control = 26. */
export const QOS_DATA_HEADER_octets: Bytes = DATA_HEADER_octets + QOS_CONTROL_octets;

/** LLC/SNAP encapsulation of an IP packet (IEEE 802.2 LLC 3 octets + SNAP 5 octets; IETF RFC 1042). */
export const LLC_SNAP_octets: Bytes = 8;
/** Largest MSDU, octets (IEEE 802.11-2020 9.2.4.7 / 9.3.2.1: MSDU size 0–2304, clause number from memory). */
export const MSDU_MAX_octets: Bytes = 2304;
/** Largest network-layer packet: the MSDU limit less LLC/SNAP = 2296 octets. */
export const PACKET_MAX_octets: Bytes = MSDU_MAX_octets - LLC_SNAP_octets;

/**
 * Security encapsulation per MPDU, octets: the header after the MAC header and
 * the MIC before the FCS. CCMP-128: 8-octet CCMP header, 8-octet MIC
 * (12.5.3.2); CCMP-256: 8 + 16 (12.5.3.2); GCMP-128 and GCMP-256: 8-octet
 * GCMP header + 16-octet MIC (12.5.5.2). Applied once per MPDU: an A-MSDU is
 * protected as one frame body.
 */
export const CIPHER_OVERHEAD: Readonly<Record<Cipher, { readonly header: Bytes; readonly mic: Bytes }>> = {
  open: { header: 0, mic: 0 },
  "CCMP-128": { header: 8, mic: 8 },
  "CCMP-256": { header: 8, mic: 16 },
  "GCMP-128": { header: 8, mic: 16 },
  "GCMP-256": { header: 8, mic: 16 },
};

/** A-MSDU subframe header: DA 6 + SA 6 + Length 2 = 14 octets (9.3.2.2.2). */
export const AMSDU_SUBFRAME_HEADER_octets: Bytes = 2 * ADDRESS_octets + 2;
/** A-MPDU delimiter: 4 octets (9.7.1). */
export const AMPDU_DELIMITER_octets: Bytes = 4;
/** A-MSDU and A-MPDU subframes (except the last) are padded to a multiple of 4 octets (9.3.2.2.2, 9.7.1). */
const SUBFRAME_ALIGN_octets = 4;

/**
 * Largest MPDU any family carries: VHT Maximum MPDU Length 11 454 octets
 * (9.4.2.157.2 VHT Capabilities; HE and EHT use the same field). The per-link
 * limits are in aggregation.ts.
 */
export const MPDU_MAX_octets: Bytes = 11454;

// Control frames (IEEE 802.11-2020 9.3.1; subclause numbers from memory).
/** RTS: Frame Control, Duration, RA, TA, FCS = 20 octets (9.3.1.2). */
export const RTS_octets: Bytes = FRAME_CONTROL_octets + DURATION_ID_octets + 2 * ADDRESS_octets + FCS_octets;
/** CTS: Frame Control, Duration, RA, FCS = 14 octets (9.3.1.3). */
export const CTS_octets: Bytes = FRAME_CONTROL_octets + DURATION_ID_octets + ADDRESS_octets + FCS_octets;
/** Ack: same fields as CTS = 14 octets (9.3.1.4). */
export const ACK_octets: Bytes = CTS_octets;
/** BAR/BA Control 2 + Starting Sequence Control 2 octets (9.3.1.7, 9.3.1.8). */
const BA_CONTROL_octets: Bytes = 2;
const STARTING_SEQUENCE_CONTROL_octets: Bytes = 2;
/** Compressed BlockAckReq: FC, Duration, RA, TA, BAR Control, SSC, FCS = 24 octets (9.3.1.7). */
export const BLOCK_ACK_REQ_octets: Bytes = RTS_octets + BA_CONTROL_octets + STARTING_SEQUENCE_CONTROL_octets;

/**
 * Bitmap sizes of the Compressed BlockAck, bits: 64 (8 octets, IEEE
 * 802.11-2020 9.3.1.8.2); 802.11ax-2021 9.3.1.8.2 adds 128 and 256 (16 and
 * 32 octets; its 32-bit bitmap is not used here, see below), 802.11be-2024
 * adds 512 and 1024 (64 and 128 octets). The sizes are signalled by the
 * Fragment Number subfield of the Starting Sequence Control field (from
 * memory of both amendments' encoding tables).
 */
export const COMPRESSED_BLOCK_ACK_BITMAP_bits: readonly number[] = [64, 128, 256, 512, 1024];

/**
 * Compressed BlockAck: FC, Duration, RA, TA, BA Control, SSC, bitmap, FCS
 * (9.3.1.8): 24 octets + the bitmap, i.e. 32 (64-bit bitmap), 40 (128),
 * 56 (256), 88 (512), 152 (1024). The smallest standard bitmap that holds
 * the block ack window is sent (a window of 128 gets the 128-bit bitmap, 512
 * the 512-bit one). Windows below 64 also get the 64-bit bitmap: HT and VHT
 * have no other, and for HE it is the larger, never the shorter, response.
 */
export function blockAckBytes(windowMpdus: number): Bytes {
  const bitmapBits = COMPRESSED_BLOCK_ACK_BITMAP_bits.find((b) => b >= windowMpdus) ?? 1024;
  return RTS_octets + BA_CONTROL_octets + STARTING_SEQUENCE_CONTROL_octets + bitmapBits / 8;
}

function alignUp(bytes: Bytes): Bytes {
  return Math.ceil(bytes / SUBFRAME_ALIGN_octets) * SUBFRAME_ALIGN_octets;
}

/** MSDU = LLC/SNAP + packet. */
export function msduBytes(packetBytes: Bytes): Bytes {
  return LLC_SNAP_octets + packetBytes;
}

/** A-MSDU of n equal MSDUs: n subframes of header + MSDU, all but the last padded to 4 octets (9.3.2.2.2). */
export function amsduBytes(msdu: Bytes, n: number): Bytes {
  const subframe = AMSDU_SUBFRAME_HEADER_octets + msdu;
  return (n - 1) * alignUp(subframe) + subframe;
}

/** The frame body before security: one MSDU, or an A-MSDU when options.amsdu > 1. */
export function payloadBytes(packetBytes: Bytes, options: MacOptions): Bytes {
  const msdu = msduBytes(packetBytes);
  return options.amsdu > 1 ? amsduBytes(msdu, options.amsdu) : msdu;
}

/**
 * Data MPDU, octets: MAC header (QoS Data 26, or 24 for non-QoS data under
 * DCF) + HT Control (4 with HTC) + security header + payload + MIC + FCS 4.
 */
export function dataMpduBytes(packetBytes: Bytes, options: MacOptions, qos: boolean): Bytes {
  const sec = CIPHER_OVERHEAD[options.cipher];
  const header = (qos ? QOS_DATA_HEADER_octets : DATA_HEADER_octets) + (options.htc ? HT_CONTROL_octets : 0);
  return header + sec.header + payloadBytes(packetBytes, options) + sec.mic + FCS_octets;
}

/** A-MPDU of `count` equal MPDUs: delimiter + MPDU per subframe, all but the last padded to 4 octets (9.7.1). */
export function ampduLength(mpdu: Bytes, count: number): Bytes {
  const subframe = AMPDU_DELIMITER_octets + mpdu;
  return (count - 1) * alignUp(subframe) + subframe;
}

/** packet_bytes check shared by every MAC entry point. */
export function checkPacketBytes(packetBytes: unknown): Bytes {
  if (typeof packetBytes === "number" && Number.isFinite(packetBytes) && packetBytes > PACKET_MAX_octets) packetTooLarge(packetBytes);
  return integerInRange("packet_bytes", packetBytes, 1, PACKET_MAX_octets, "octets");
}

/** Out of line, so the check above stays small enough to inline (src/core/args.ts). */
function packetTooLarge(packetBytes: number): never {
  invalid(
    `packet_bytes: ${packetBytes} is over ${PACKET_MAX_octets} octets, the largest packet an MSDU carries ` +
      `(${MSDU_MAX_octets}-octet MSDU less ${LLC_SNAP_octets} octets of LLC/SNAP); use AMSDU=n to carry more per MPDU`,
  );
}

/**
 * MPDU (catalog): the length of a QoS Data MPDU carrying `packet_bytes`
 * (or an A-MSDU of AMSDU=n such packets), octets.
 *
 *   mpduBytes(1500) → 26 + 8 + (8 + 1500) + 8 + 4 = 1554   (CCMP-128)
 *
 * Without a link only the largest MPDU of any family (11 454 octets) bounds
 * an A-MSDU here; ACCESS, AGGCOUNT and GOODPUT check the link's own limit.
 */
export function mpduBytes(packetBytes: unknown, macOptions?: unknown): Bytes {
  const packet = checkPacketBytes(packetBytes);
  const options = parseMacOptions(macOptions);
  const mpdu = dataMpduBytes(packet, options, true);
  if (mpdu > MPDU_MAX_octets) amsduTooLarge(options.amsdu, packet, mpdu);
  return mpdu;
}

function amsduTooLarge(amsdu: number, packet: Bytes, mpdu: Bytes): never {
  invalid(`mac_options: AMSDU=${amsdu} of ${packet}-octet packets makes a ${mpdu}-octet MPDU, over the largest MPDU of any PHY (${MPDU_MAX_octets} octets, VHT/HE/EHT); use fewer MSDUs`);
}

/**
 * AMPDU (catalog): length of an A-MPDU of `count` MPDUs of `mpdu_bytes` each,
 * octets.
 *
 *   ampduBytes(1554, 2) → (4 + 1554 + 2 pad) + (4 + 1554) = 3118
 */
export function ampduBytes(mpduBytesArg: unknown, count: unknown): Bytes {
  const mpdu = integerInRange("mpdu_bytes", mpduBytesArg, 1, MPDU_MAX_octets, "octets");
  const n = integerInRange("count", count, 1, 1024, "MPDUs (the largest block ack window, EHT)");
  return ampduLength(mpdu, n);
}
