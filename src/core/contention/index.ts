/**
 * Contention (DESIGN.md §2): what many saturated stations sharing one channel
 * pay in idle backoff slots, collisions, EIFS and recovery.
 * The only barrel of src/core/contention.
 *
 *   catalog.ts     COLLIDE, SATURATE, CONTENTION, EDCAMIX (argument checks, memo, rows)
 *   parameters.ts  the raw contention terms both sides take (countdown rule, timeouts, EIFS, BAR)
 *   fromLink.ts    link + MAC settings → those terms
 *   bianchi.ts     Bianchi's backoff chain with a retry limit; the bracketed root search
 *   saturation.ts  one class: frozen counters, EIFS and BlockAckReq on a renewal chain
 *   aifsZones.ts   several access categories: the EDCA countdown over AIFS zones
 *   simulator.ts   a seeded Monte Carlo written from the standard's rules, to judge the models
 */
export { collisionProbability, saturationGoodputMbps, contentionShare, edcaMix, STATIONS_MAX, type EdcaMixRow } from "./catalog";
export { attemptProbability, fixedPoint, bracketedRoot, type FixedPoint } from "./bianchi";
export { saturation, type Saturation } from "./saturation";
export { edcaSaturation, type ClassResult, type MixResult } from "./aifsZones";
export { contentionChannel, classFromAccess, type ClassSpec } from "./fromLink";
export { aifsUs as classAifsUs, type ContentionChannel, type ContentionClass, type Countdown, type BlockAckRequestExchange } from "./parameters";
export {
  simulate,
  mulberry32,
  type SimulationParams,
  type SimulationClass,
  type SimulationLength,
  type SimulationResult,
  type SimulatedClass,
} from "./simulator";
