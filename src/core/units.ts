/**
 * Unit aliases. DESIGN.md §1 fixes the units: time in microseconds, sizes in
 * octets, rates in Mb/s, power in dBm, gains and losses in dB, frequency in
 * MHz, band in GHz, shares as fractions 0..1. The aliases document intent;
 * TypeScript treats them all as `number`.
 */
export type Microseconds = number;
export type Bytes = number;
export type MbPerSecond = number;
export type Dbm = number;
export type Db = number;
export type MHz = number;
export type GHz = number;
export type Meters = number;
export type Share = number;
