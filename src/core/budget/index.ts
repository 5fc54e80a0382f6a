/**
 * Site budget: cells and access points, beacon airtime, client airtime
 * shares and radios needed. Planning estimates, not a replacement for a site
 * survey.
 */
export { coverageAps, hexagonAreaM2, DEFAULT_OVERLAP_SHARE } from "./coverage";
export { radios, DEFAULT_MAX_UTILIZATION } from "./radios";
export { beaconShare, beaconAirtime, beaconParts, defaultBeaconBytes, BEACON_PARTS, TU_us, DEFAULT_INTERVAL_TU, BEACON_ACCESS, BEACON_MAC_OPTIONS } from "./beacon";
export type { BeaconAirtime, BeaconElement, BeaconApFamily } from "./beacon";
export { clientShare, mixShare, DEFAULT_PACKET_BYTES, DEFAULT_STATIONS } from "./share";
export { saturationGoodputTcpMbps, dataOnlyMacOptions } from "./tcp";
