/**
 * Multi-user (HE/EHT OFDMA) core: RU allocation, Trigger/MU-BAR/Multi-STA
 * BlockAck sizes, MU and TB PPDU durations, and one multi-user exchange
 * (DESIGN.md §2, MUACCESS, MUGOODPUT, MUBREAKDOWN). The only barrel of src/core/mu.
 */
export { RUS_PER_CHANNEL, maxUsers, checkUsers } from "./ru";
export {
  triggerFrameBytes,
  triggerPaddingOctets,
  multiStaBlockAckBytes,
  multiStaBitmapOctets,
  TRIGGER_PADDING_us,
  type TriggerKind,
} from "./frames";
export { muPpdu, tbPpdu, ackTbLink, heSigBSymbolsFor, ehtSigSymbolsFor, contentChannels, TB_GI_LTF, T_HE_STF_T_us, type Ppdu, type TbPpdu } from "./ppdu";
export { muExchange, muAccessUs, muGoodputMbps, muBreakdownTable, parseDirection, type Direction, type MuExchange } from "./exchange";
