/**
 * MUACCESS, MUGOODPUT and MUBREAKDOWN: one multi-user exchange term by term,
 * the argument checks, and properties against the single-user exchange.
 */
import { muAccessUs, muBreakdownTable, muExchange, muGoodputMbps, RUS_PER_CHANNEL } from "../../../src/core/mu";
import { channelAccess, goodputMbps } from "../../../src/core/mac";
import { parseLink } from "../../../src/core/link";
import { expectValueError, expectValueErrorNaming } from "../../_lib/expectError";

const UP_LINK = "HE MCS7 1SS 20MHz RU26 GI1.6 BCC 5GHz";

describe("one full up exchange, term by term (9 × RU26, 100-octet packets, one MPDU each, BE)", () => {
  const x = muExchange(UP_LINK, 9, 100, "up", 1);
  // Each value derived by hand; the size's clause (or "from memory") beside it.
  const expected: [RegExp, number][] = [
    // AIFS[BE] = aSIFSTime 16 + AIFSN 3 × aSlotTime 9 (IEEE 802.11-2020 10.3.2.3; AP AIFSN for BE 3, Table 9-155 AP column, from memory)
    [/^AIFS\[BE\]/, 16 + 3 * 9],
    // mean backoff CWmin 15 ÷ 2 slots (10.23.2.2)
    [/^mean backoff/, 7.5 * 9],
    // Basic Trigger 16 + 8 + 9 × 6 + 48 + 4 = 130 octets (9.3.1.22, from memory) at 24 Mb/s: ceil((16 + 1040 + 6) / 96) = 12 symbols → 20 + 48 (eq. 17-29)
    [/^Basic Trigger \(9 User Info, 130 octets, 24 Mb\/s\)$/, 20 + 4 * 12],
    [/^SIFS$/, 16],
    // TB PPDU: S-MPDU = delimiter 4 + MPDU (QoS header 26 + CCMP 8 + LLC/SNAP 8 + 100 + MIC 8 + FCS 4 = 154) = 158 octets (9.7.1, 9.3.2.1, 12.5.3);
    // BCC 8 × 158 + 22 = 1286 bits → N_SYM 11, N_excess 86 → a = ceil(86 / 30) = 3 → PE 12 (27.3.12, 27.3.13);
    // 40 + 8 + 11 × 14.4 + 12 = 218.4 µs (27.4.3) → ceil(198.4 / 4) = 50 → UL Length 145 → 20 + 200 = 220 µs (27.3.11.5)
    [/^HE TB PPDU \(9 × S-MPDU on RU26, 158 octets each, UL Length 145\)$/, 20 + 50 * 4],
    [/^SIFS$/, 16],
    // Multi-STA BlockAck 16 + 2 + 9 × 2 + 4 = 40 octets (9.3.1.8.7, Ack Type 1 per user; from memory) at 24 Mb/s: ceil(342 / 96) = 4 → 36 µs
    [/^Multi-STA BlockAck \(9 users, 40 octets, 24 Mb\/s\)$/, 20 + 4 * 4],
  ];
  it.each(expected.map((e, i) => [i, e[0], e[1]] as const))("term %i %s is %d µs", (i, label, us) => {
    expect(x.terms[i].label).toMatch(label);
    expect(x.terms[i].us).toBeCloseTo(us, 9);
  });
  it("has exactly those terms and totals 466.5 µs", () => {
    expect(x.terms).toHaveLength(expected.length);
    expect(x.totalUs).toBe(43 + 67.5 + 68 + 16 + 220 + 16 + 36);
  });
  it("MUGOODPUT is 9 × 100 × 8 bits ÷ that airtime", () => {
    expect(muGoodputMbps(UP_LINK, 9, 100, "up", 1)).toBeCloseTo((9 * 100 * 8) / 466.5, 12);
  });
});

describe("the down exchange", () => {
  it("with a trigger in the PPDU: AIFS, backoff, MU PPDU, SIFS, TB PPDU of acknowledgements", () => {
    const labels = muExchange("HE MCS7 1SS 20MHz RU26 5GHz", 9, 100, "down", 1).terms.map((t) => t.label);
    expect(labels.map((l) => l.split(" ")[0])).toEqual(["AIFS[BE]", "mean", "HE", "SIFS", "HE"]);
    expect(labels[2]).toBe("HE MU PPDU (9 × 1 MPDU and a Basic Trigger on RU26, 198 octets each)");
  });
  it("the aggregated trigger adds pad + delimiter 4 + a 34-octet Basic Trigger (16 + 8 + 6 + 4) to each user's PSDU", () => {
    // The data subframe is delimiter 4 + MPDU 154 = 158 octets, padded to 160 (9.7.1), then delimiter 4 + Basic Trigger 34.
    const label = muExchange("HE MCS7 1SS 20MHz RU26 5GHz", 9, 100, "down", 1).terms[2].label;
    expect(label).toContain(`${160 + 4 + 34} octets`);
  });
  it("with MUBAR: the MU-BAR trigger at the control rate and a SIFS come before the TB PPDU", () => {
    const labels = muExchange("HE MCS7 1SS 20MHz RU26 5GHz", 9, 100, "down", 1, "BE", "MUBAR").terms.map((t) => t.label);
    expect(labels[4]).toBe("MU-BAR trigger (9 User Info, 157 octets, 24 Mb/s)");
    expect(labels[5]).toBe("SIFS");
    expect(labels[6]).toMatch(/^HE TB PPDU \(9 × Ack on RU26, MCS3 1SS\)$/);
  });
});

describe("argument checks", () => {
  const L20 = "HE MCS7 1SS 20MHz RU26 5GHz";
  it.each([0, -1, 1.5, NaN, "x", null])("users %p is refused, naming users and what is valid", (u) => {
    expectValueError(() => muAccessUs(L20, u, 100), /^users: expected a whole number of stations, 1–9 \(9 × RU26 fit in 20 MHz\)/);
  });
  it("at most 9 × RU26, 4 × RU52, 2 × RU106 and 1 × RU242 in 20 MHz (27.3.2.2 tone plan)", () => {
    expect(RUS_PER_CHANNEL[20]).toEqual({ 26: 9, 52: 4, 106: 2, 242: 1 });
    expect(muAccessUs(L20, 9, 100)).toBeGreaterThan(0);
    expectValueError(() => muAccessUs(L20, 10, 100), /^users: 10 is more than fit: 1–9/);
    expectValueError(() => muAccessUs("HE MCS7 1SS 20MHz RU52 5GHz", 5, 100), /^users: 5 is more than fit: 1–4/);
    expectValueError(() => muAccessUs("HE MCS7 1SS 20MHz RU106 5GHz", 3, 100), /^users: 3 is more than fit: 1–2/);
  });
  it("37 × RU26 in 80 MHz, not 38", () => {
    expect(muAccessUs("HE MCS7 1SS 80MHz RU26 5GHz", 37, 100, "down", 1)).toBeGreaterThan(0);
    expectValueErrorNaming(() => muAccessUs("HE MCS7 1SS 80MHz RU26 5GHz", 38, 100), "users");
  });
  it("the whole channel (no RU) serves one user; more would need MU-MIMO", () => {
    expectValueError(() => muAccessUs("HE MCS7 1SS 20MHz 5GHz", 2, 100), /^users: 2 users need OFDMA resource units or MU-MIMO/);
  });
  it("refuses RU sizes the channel or family lacks through the link", () => {
    expectValueErrorNaming(() => muAccessUs("HE MCS7 1SS 20MHz RU484 5GHz", 1, 100), "link");
    expectValueErrorNaming(() => muAccessUs("HE MCS7 1SS 20MHz RU4x996 5GHz", 1, 100), "link");
  });
  it("refuses families without OFDMA and the ER SU PPDU", () => {
    expectValueError(() => muAccessUs("VHT MCS7 1SS 20MHz 5GHz", 1, 100), /^link: multi-user OFDMA needs an HE or EHT link/);
    expectValueErrorNaming(() => muAccessUs("HE MCS0 1SS 20MHz ER 5GHz", 1, 100), "link");
  });
  it("up needs a TB PPDU GI/LTF pair", () => {
    expectValueError(() => muAccessUs(L20, 9, 100, "up"), /^link: an HE TB PPDU \(direction up\) takes 2xLTF GI1.6 or 4xLTF GI3.2/);
  });
  it("direction, access, mpdus and MUBAR with up are refused with their names", () => {
    expectValueErrorNaming(() => muAccessUs(L20, 9, 100, "sideways"), "direction");
    expectValueErrorNaming(() => muAccessUs(L20, 9, 100, "down", 1, "DCF"), "access");
    expectValueErrorNaming(() => muAccessUs(L20, 9, 100, "down", 0), "mpdus");
    expectValueErrorNaming(() => muAccessUs(L20, 9, 100, "down", 100000), "mpdus");
    expectValueErrorNaming(() => muAccessUs(UP_LINK, 9, 100, "up", 1, "BE", "MUBAR"), "mac_options");
    expectValueErrorNaming(() => muAccessUs(L20, 9, 0), "packet_bytes");
  });
  it("accepts DL/UL and any case for direction, and omitted arguments as defaults", () => {
    expect(muAccessUs(UP_LINK, 9, 100, " UL ", 1)).toBe(muAccessUs(UP_LINK, 9, 100, "up", 1));
    expect(muAccessUs(L20, 9, 100, null, null, null, null)).toBe(muAccessUs(L20, 9, 100, "down", "auto", "BE", ""));
  });
  it("refuses, naming users, a Multi-STA BlockAck too long for a non-HT PPDU", () => {
    // 148 users × (2 + 2 + 128) octets with the EHT 1024 window: far over 4095 octets
    expectValueErrorNaming(() => muAccessUs("EHT MCS7 1SS 320MHz RU26 GI1.6 6GHz", 148, 100, "up"), "users");
  });
  it("auto fits the TXOP limit: VO's 2080 µs bounds the whole exchange after the backoff", () => {
    const x = muExchange("HE MCS7 1SS 20MHz RU26 5GHz", 9, 1500, "down", "auto", "VO");
    expect(x.totalUs - x.terms[0].us - x.terms[1].us).toBeLessThanOrEqual(2080);
    expect(() => muExchange("HE MCS7 1SS 20MHz RU26 5GHz", 9, 1500, "down", x.mpdus + 1, "VO")).toThrow(/^mpdus: /);
  });
});

describe("MUBREAKDOWN", () => {
  const args: unknown[][] = [
    [UP_LINK, 9, 100, "up", 1],
    ["HE MCS7 1SS 20MHz RU26 5GHz", 9, 100, "down", "auto"],
    ["EHT MCS9 2SS 80MHz RU242 5GHz", 4, 1500, "down", "auto", "BE", "MUBAR"],
    ["HE MCS11 2SS 80MHz", 1, 1500, "down"],
  ];
  it.each(args)("its total row is MUACCESS and the sum of the other rows (%s)", (...a) => {
    const rows = muBreakdownTable(...(a as Parameters<typeof muBreakdownTable>));
    const total = rows[rows.length - 1];
    expect(total[0]).toBe("total (µs)");
    expect(total[1]).toBe(muAccessUs(...(a as Parameters<typeof muAccessUs>)));
    expect(rows.slice(0, -1).reduce((s, r) => s + (r[1] as number), 0)).toBeCloseTo(total[1] as number, 9);
  });
  it("does not mutate its arguments", () => {
    const opts = "MUBAR BA=64";
    muBreakdownTable("HE MCS7 1SS 20MHz RU26 5GHz", 9, 100, "down", 1, "BE", opts);
    expect(opts).toBe("MUBAR BA=64");
  });
});

/** A grid of whole-channel HE/EHT links the parser accepts. */
function wholeChannelLinks(): string[] {
  const out: string[] = [];
  for (const fam of ["HE", "EHT"]) {
    for (let mcs = 0; mcs <= (fam === "HE" ? 11 : 13); mcs++) {
      for (const w of [20, 40, 80, 160, 320]) {
        for (const gi of [0.8, 1.6, 3.2]) {
          for (const band of [2.4, 5, 6]) {
            const text = `${fam} MCS${mcs} 1SS ${w}MHz GI${gi} ${band}GHz`;
            try {
              parseLink(text);
              out.push(text);
            } catch {
              /* not a link the standard allows */
            }
          }
        }
      }
    }
  }
  return out;
}

describe("properties against the single-user exchange", () => {
  const links = wholeChannelLinks();
  const counts = [1, 2, 16];

  it("up: one user on the whole channel costs at least the single-user ACCESS for the same MPDUs", () => {
    let checked = 0;
    for (const link of links.filter((l) => !l.includes("GI0.8"))) {
      for (const n of counts) {
        let su: number;
        try {
          su = channelAccess(link, 1500, n).totalUs;
        } catch {
          continue;
        }
        expect([link, n, muAccessUs(link, 1, 1500, "up", n) >= su]).toEqual([link, n, true]);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(100);
  });

  it("down: one user on the whole channel costs at least the single-user ACCESS, except where its TB PPDU acknowledgement is shorter than the non-HT response", () => {
    // The TB PPDU BlockAck spans the whole channel at the HE-MCS of the control rate; against a non-HT
    // BlockAck at 6 or 12 Mb/s (MCS 0–2) on 40 MHz and wider it can be the shorter one (a 1024-bit EHT bitmap
    // at 12 Mb/s lasts 124 µs, the TB PPDU 76 µs). Everything before the acknowledgement always costs at least as much.
    let checked = 0;
    let exceptions = 0;
    for (const link of links) {
      for (const n of counts) {
        let su: ReturnType<typeof channelAccess>;
        try {
          su = channelAccess(link, 1500, n);
        } catch {
          continue;
        }
        const x = muExchange(link, 1, 1500, "down", n);
        const tbAckUs = x.terms[x.terms.length - 1].us;
        expect([link, n, x.totalUs - tbAckUs >= su.totalUs - su.responseUs - 1e-9]).toEqual([link, n, true]);
        if (tbAckUs >= su.responseUs) expect([link, n, x.totalUs >= su.totalUs]).toEqual([link, n, true]);
        else {
          exceptions++;
          expect([link, su.controlRateMbps <= 12]).toEqual([link, true]);
        }
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(500);
    expect(exceptions).toBeLessThan(checked / 10);
  });

  it("9 × RU26 in 20 MHz with 100-byte packets, one each: OFDMA delivers more than the same 9 stations served one by one (common practice)", () => {
    // One by one, the nine share the channel: their aggregate is GOODPUT of the whole-channel link.
    for (const fam of ["HE", "EHT"]) {
      for (let mcs = 0; mcs <= 11; mcs++) {
        for (const dir of ["down", "up"]) {
          const link = `${fam} MCS${mcs} 1SS 20MHz GI1.6 5GHz`;
          const ofdma = muGoodputMbps(`${link} RU26`, 9, 100, dir, 1);
          const oneByOne = goodputMbps(link, 100, 1);
          expect([link, dir, ofdma > oneByOne]).toEqual([link, dir, true]);
        }
      }
    }
  });
});
