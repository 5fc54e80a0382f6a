// PLACEHOLDER: being written; replace whole file.
import type { PhyFamily } from "./types";
import { invalid } from "../errors";
export const eht: PhyFamily = { family: "eht" as never, mcsValues: [], validate() { invalid("link: not implemented yet"); }, rateMbps: () => NaN, txtime: () => ({ totalUs: NaN, terms: [] }), maxPsduBytes: () => 0, sensitivityDbm: () => NaN, nonHtReferenceRateMbps: () => NaN };
