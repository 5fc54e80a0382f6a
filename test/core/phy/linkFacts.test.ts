/**
 * The per-link memo behind RATE, TXTIME and SENSITIVITY (src/core/phy/index.ts):
 * a remembered answer must be the equation's answer, whatever order the
 * lengths come in and however they share the memo's slots, and a bad
 * argument must be refused however warm the memo is.
 */
import { AirtallyError } from "../../../src/core/errors";
import { rateMbps, sensitivityDbm, txtimeUs } from "../../../src/core/phy/index";
import { expectValueErrorNaming } from "../../_lib/expectError";

/** IEEE 802.11-2020 eq. (17-29): TXTIME = T_PREAMBLE + T_SIGNAL + T_SYM × ceil((16 + 8 × LENGTH + 6) ÷ N_DBPS), 20 MHz: 16 + 4 + 4 × N_SYM µs. */
function ofdmTxtime(lengthOctets: number, nDbps: number): number {
  return 16 + 4 + 4 * Math.ceil((16 + 8 * lengthOctets + 6) / nDbps);
}

/** Every length the OFDM PHY carries: 0 … 4095 octets (aPSDUMaxLength, IEEE 802.11-2020 Table 17-21, from memory). */
const ALL_LENGTHS = Array.from({ length: 4096 }, (_, n) => n);

describe("TXTIME memo per link", () => {
  // N_DBPS from IEEE 802.11-2020 Table 17-4: 216 at 54 Mb/s, 24 at 6 Mb/s, 20 MHz.
  const cases = [
    { link: "OFDM 54Mbps 5GHz", nDbps: 216 },
    { link: "OFDM 6Mbps 5GHz", nDbps: 24 },
  ];

  it("answers eq. (17-29) for every length, forwards, backwards and in a stride that revisits evicted lengths", () => {
    // 4096 lengths share far fewer slots, so later passes meet both remembered and evicted entries.
    const orders = [ALL_LENGTHS, [...ALL_LENGTHS].reverse(), ALL_LENGTHS.map((_, k) => (k * 1031) % 4096)];
    for (const { link, nDbps } of cases) {
      for (const order of orders) {
        const wrong = order.filter((n) => txtimeUs(link, n) !== ofdmTxtime(n, nDbps));
        expect(wrong).toEqual([]);
      }
    }
  });

  it("alternates two lengths without mixing their answers", () => {
    for (let k = 0; k < 100; k++) {
      expect(txtimeUs("OFDM 54Mbps 5GHz", 1500)).toBe(ofdmTxtime(1500, 216)); // 20 + 4 × ceil(12022 ÷ 216) = 20 + 4 × 56 = 244 µs
      expect(txtimeUs("OFDM 54Mbps 5GHz", 1756)).toBe(ofdmTxtime(1756, 216));
    }
  });

  it("refuses bad lengths even when the memo is full", () => {
    for (const n of ALL_LENGTHS) txtimeUs("OFDM 24Mbps 5GHz", n);
    for (const bad of [-1, -0.5, 0.5, 1500.25, NaN, Infinity, -Infinity, 4096, 2 ** 32, -(2 ** 32), 2 ** 32 + 1500]) {
      expectValueErrorNaming(() => txtimeUs("OFDM 24Mbps 5GHz", bad), "psdu_bytes");
    }
    for (const bad of ["1500", null, undefined, true, [[1500]]]) {
      expectValueErrorNaming(() => txtimeUs("OFDM 24Mbps 5GHz", bad), "psdu_bytes");
    }
  });
});

describe("SENSITIVITY and RATE memo per link", () => {
  it("gives Table 17-18's minimum sensitivity on every call (IEEE 802.11-2020 Table 17-18, 20 MHz)", () => {
    const table: [number, number][] = [[6, -82], [9, -81], [12, -79], [18, -77], [24, -74], [36, -70], [48, -66], [54, -65]];
    for (let pass = 0; pass < 3; pass++) {
      for (const [mbps, dbm] of table) expect(sensitivityDbm(`OFDM ${mbps}Mbps 5GHz`)).toBe(dbm);
    }
  });

  it("answers #N/A on every call where the standard gives no sensitivity (HT MCS 33, Table 19-23 has none)", () => {
    for (let pass = 0; pass < 3; pass++) {
      let caught: unknown;
      try {
        sensitivityDbm("HT MCS33 20MHz");
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(AirtallyError);
      expect((caught as AirtallyError).kind).toBe("na");
    }
  });

  it("gives the same rate for a link first seen by TXTIME (IEEE 802.11-2020 Table 17-4: 54 Mb/s)", () => {
    const spelling = "ofdm  54Mbps 5ghz"; // the memo is keyed by the text as given: this spelling is new here
    expect(txtimeUs(spelling, 100)).toBe(ofdmTxtime(100, 216));
    expect(rateMbps(spelling)).toBe(54);
  });
});
