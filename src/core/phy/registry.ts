/**
 * Family name → module. Adding a PHY family is adding a file and a line here.
 */
import type { Family } from "../link";
import type { PhyFamily } from "./types";
import { dsss, hrDsss } from "./dsss";
import { ofdm, erpOfdm } from "./ofdm";
import { ht } from "./ht";
import { vht } from "./vht";
import { he } from "./he";
import { eht } from "./eht";

const MODULES: Readonly<Record<Family, PhyFamily>> = {
  DSSS: dsss,
  "HR-DSSS": hrDsss,
  OFDM: ofdm,
  "ERP-OFDM": erpOfdm,
  HT: ht,
  VHT: vht,
  HE: he,
  EHT: eht,
};

export function familyModule(family: Family): PhyFamily {
  return MODULES[family];
}
