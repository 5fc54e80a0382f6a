/**
 * Control frames of a multi-user exchange, octets, from their formats
 * (IEEE Std 802.11ax-2021 9.3.1.22 Trigger frame, 9.3.1.8.7 Multi-STA
 * BlockAck; IEEE Std 802.11be-2024 for the EHT additions). Field sizes are
 * from memory, each marked where it is set.
 *
 *   Trigger frame = Frame Control 2 + Duration 2 + RA 6 + TA 6
 *                 + Common Info 8 [+ Special User Info 5, EHT]
 *                 + users × (User Info 5 + Trigger Dependent User Info)
 *                 + Padding + FCS 4
 *   Multi-STA BlockAck = Frame Control 2 + Duration 2 + RA 6 + TA 6 + BA Control 2
 *                 + users × Per AID TID Info + FCS 4
 */
import type { Bytes, MbPerSecond, Microseconds } from "../units";
import type { Family } from "../link";
import { ADDRESS_octets, DURATION_ID_octets, FCS_octets, FRAME_CONTROL_octets } from "../mac/frames";

/** Frame Control, Duration, RA and TA: the start of every Trigger and BlockAck frame, 16 octets (9.3.1.22, 9.3.1.8). */
export const CONTROL_HEADER_octets: Bytes = FRAME_CONTROL_octets + DURATION_ID_octets + 2 * ADDRESS_octets;
/** Common Info field, 8 octets (64 bits) in the HE and EHT variants (9.3.1.22.1; from memory). */
export const COMMON_INFO_octets: Bytes = 8;
/** Special User Info field (AID12 = 2007), 5 octets, right after Common Info when the trigger solicits EHT TB PPDUs (802.11be-2024 9.3.1.22.3; from memory). */
export const SPECIAL_USER_INFO_octets: Bytes = 5;
/** User Info field without its Trigger Dependent User Info, 5 octets (40 bits) (9.3.1.22.1; from memory). */
export const USER_INFO_octets: Bytes = 5;
/** Basic Trigger's Trigger Dependent User Info: MPDU MU Spacing Factor, TID Aggregation Limit, Preferred AC = 1 octet (9.3.1.22.2; from memory). */
export const BASIC_TRIGGER_DEPENDENT_octets: Bytes = 1;
/** MU-BAR's Trigger Dependent User Info: BAR Control 2 + BAR Information of a compressed BlockAckReq (Starting Sequence Control 2) = 4 octets (9.3.1.22.3, 9.3.1.7.?; from memory). */
export const MU_BAR_TRIGGER_DEPENDENT_octets: Bytes = 4;
/** BA Control field, 2 octets (9.3.1.8). */
const BA_CONTROL_octets: Bytes = 2;
/** Per AID TID Info: AID TID Info 2 octets; with a block ack also Starting Sequence Control 2 and the bitmap (9.3.1.8.7; from memory). */
const AID_TID_INFO_octets: Bytes = 2;
const STARTING_SEQUENCE_CONTROL_octets: Bytes = 2;

/**
 * Trigger padding: the recipients' MinTrigProcTime. A station advertises its
 * Trigger Frame MAC Padding Duration as 0, 8 or 16 µs (HE Capabilities,
 * 802.11ax-2021 9.4.2.248.2; from memory); we pad for the largest, 16 µs,
 * so a sheet does not under-count (our choice, like PE16 for the packet
 * extension). The Padding field, when present, is at least 2 octets (from memory).
 */
export const TRIGGER_PADDING_us: Microseconds = 16;
const PADDING_MIN_octets: Bytes = 2;

export type TriggerKind = "basic" | "mubar";

/** Padding octets that last TRIGGER_PADDING_us at the trigger's rate: ceil(16 µs × rate ÷ 8). */
export function triggerPaddingOctets(rateMbps: MbPerSecond): Bytes {
  return Math.max(PADDING_MIN_octets, Math.ceil((TRIGGER_PADDING_us * rateMbps) / 8));
}

/** Trigger frame length, octets, for `users` User Info fields (and `paddingOctets` of Padding; 0 for none). */
export function triggerFrameBytes(kind: TriggerKind, users: number, family: Family, paddingOctets: Bytes): Bytes {
  const dependent = kind === "basic" ? BASIC_TRIGGER_DEPENDENT_octets : MU_BAR_TRIGGER_DEPENDENT_octets;
  const special = family === "EHT" ? SPECIAL_USER_INFO_octets : 0;
  return CONTROL_HEADER_octets + COMMON_INFO_octets + special + users * (USER_INFO_octets + dependent) + paddingOctets + FCS_octets;
}

/**
 * Block Ack Bitmap sizes a Multi-STA BlockAck may carry, bits: 32, 64, 128,
 * 256 (802.11ax-2021 9.3.1.8.7, set by the Fragment Number subfield; from
 * memory) and 512, 1024 (802.11be-2024). The smallest that holds the window is sent.
 */
const MULTI_STA_BITMAP_bits: readonly number[] = [32, 64, 128, 256, 512, 1024];

export function multiStaBitmapOctets(windowMpdus: number): Bytes {
  return (MULTI_STA_BITMAP_bits.find((b) => b >= windowMpdus) ?? 1024) / 8;
}

/**
 * Multi-STA BlockAck, octets: one Per AID TID Info per user — an
 * acknowledgement of a single MPDU (Ack Type 1) is the AID TID Info alone,
 * a block ack adds the Starting Sequence Control and the bitmap.
 */
export function multiStaBlockAckBytes(users: number, blockAck: boolean, windowMpdus: number): Bytes {
  const perUser = blockAck ? AID_TID_INFO_octets + STARTING_SEQUENCE_CONTROL_octets + multiStaBitmapOctets(windowMpdus) : AID_TID_INFO_octets;
  return CONTROL_HEADER_octets + BA_CONTROL_octets + users * perUser + FCS_octets;
}
