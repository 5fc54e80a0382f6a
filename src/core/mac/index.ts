/**
 * MAC core: frame sizes, EDCA timing, aggregation, one channel access,
 * goodput and retransmission (DESIGN.md §2, MAC and AIFS entries).
 * The only barrel of src/core/mac.
 */
export { parseMacOptions, DEFAULT_MAC_OPTIONS, CIPHERS, type Cipher, type MacOptions } from "./options";
export {
  mpduBytes,
  ampduBytes,
  blockAckBytes,
  ACK_octets,
  RTS_octets,
  CTS_octets,
  BLOCK_ACK_REQ_octets,
  PACKET_MAX_octets,
} from "./frames";
export {
  parseAccess,
  parseProtection,
  edcaParameters,
  aifsUs,
  AIFS_DEFAULT_LINK,
  type AccessCategory,
  type Protection,
  type EdcaParameters,
} from "./edca";
export { aPPDUMaxTime_us } from "./timing";
export { aggCount, type AggregationLimit } from "./aggregation";
export { channelAccess, type AccessTerm, type ChannelAccess } from "./access";
export { goodputMbps, efficiency, expectedTransmissions, parseMpduLoss } from "./goodput";
export { tcpAckAccessUs, withTcpAcks, withoutTcpText, tcpAckSegments, TCP_ACK_PACKET_octets, DEFAULT_TCP_ACK_SEGMENTS } from "./tcp";
export { exchangeContext, type ExchangeContext } from "./exchange";
