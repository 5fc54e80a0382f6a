/**
 * One sample call per catalog function, with the core call it must equal.
 * The bundle test fails when a registered function has no sample here, so
 * every function added to the catalog gets exercised through the built bundle.
 */
import * as core from "../../src/core/index";

export interface Sample {
  readonly args: unknown[];
  /** The same computation through src/core. */
  readonly expected: () => unknown;
}

export const SAMPLES: Record<string, Sample[]> = {
  LINK: [
    { args: ["HE", 9, 2, 80, null, null, null], expected: () => core.parseLink("HE MCS9 2SS 80MHz").text },
    { args: ["ERP-OFDM", 54, null, null, null, null, null], expected: () => core.parseLink("ERP-OFDM 54Mbps").text },
    { args: ["HT", 15, null, 40, 0.4, 2.4, "GF"], expected: () => core.parseLink("HT MCS15 40MHz SGI GF 2.4GHz").text },
  ],
  RATE: [
    { args: ["OFDM 54Mbps 5GHz"], expected: () => core.rateMbps("OFDM 54Mbps 5GHz") },
    { args: ["VHT MCS9 2SS 80MHz GI0.4"], expected: () => core.rateMbps("VHT MCS9 2SS 80MHz GI0.4") },
  ],
  TXTIME: [
    { args: ["ERP-OFDM 54Mbps", 1500], expected: () => core.txtimeUs("ERP-OFDM 54Mbps", 1500) },
    { args: ["HE MCS11 2SS 80MHz", 65000], expected: () => core.txtimeUs("HE MCS11 2SS 80MHz", 65000) },
  ],
  PSDUFIT: [{ args: ["HT MCS7 20MHz", 5484], expected: () => core.psduFit("HT MCS7 20MHz", 5484) }],
  SENSITIVITY: [{ args: ["VHT MCS9 2SS 80MHz"], expected: () => core.sensitivityDbm("VHT MCS9 2SS 80MHz") }],
  TXTIMEPARTS: [{ args: ["HR-DSSS 11Mbps short", 1500], expected: () => core.txtimeTable("HR-DSSS 11Mbps short", 1500) }],
};
