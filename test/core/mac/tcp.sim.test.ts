/**
 * TCP acknowledgements checked by a small timeline simulation written from
 * the rules, not from the model's formula: a station sends A-MPDUs of N
 * MPDUs, each access drawing its backoff uniformly from 0..CWmin slots
 * (IEEE 802.11-2020 10.23.2.2) and losing each MPDU independently with
 * probability p (lost ones go again in later A-MPDUs, so every access still
 * carries N); the receiver counts delivered segments and, at every TCPACK-th,
 * sends a TCP ACK in an access of its own (RFC 1122 4.2.3.2), which also
 * draws its backoff. Frame durations are the PHY/MAC terms of BREAKDOWN
 * (tested against the standard elsewhere). The long-run goodput must match
 * GOODPUT with TCP.
 */
import { channelAccess, goodputMbps } from "../../../src/core/mac/index";

/** A small seeded generator (mulberry32), here so the check depends on no model code. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function simulateTcp(link: string, packetBytes: number, mpdus: number, loss: number, ackEvery: number, accesses: number, seed: number): number {
  const data = channelAccess(link, packetBytes, mpdus);
  const ack = channelAccess(link, 40, 1);
  const fixed = (a: typeof data) => a.totalUs - a.backoffUs; // AIFS + PPDU + SIFS + response, without the mean backoff
  const rnd = seeded(seed);
  const backoff = (a: typeof data) => Math.floor(rnd() * (a.edca.cwMin + 1)) * a.edca.slotUs;
  let timeUs = 0;
  let delivered = 0;
  let pendingForAck = 0;
  for (let i = 0; i < accesses; i++) {
    timeUs += fixed(data) + backoff(data);
    for (let m = 0; m < mpdus; m++) {
      if (rnd() < loss) continue;
      delivered++;
      if (++pendingForAck === ackEvery) {
        pendingForAck = 0;
        timeUs += fixed(ack) + backoff(ack);
      }
    }
  }
  return (8 * packetBytes * delivered) / timeUs;
}

describe("TCP goodput against a timeline simulation", () => {
  it.each([
    ["OFDM 54Mbps 5GHz", 1, 0, 2],
    ["HE MCS9 2SS 80MHz 5GHz", 64, 0.1, 2],
    ["VHT MCS7 2SS 80MHz 5GHz", 32, 0.05, 1],
  ] as const)("%s, %i MPDUs, loss %p, an ACK per %i segments", (link, mpdus, loss, ackEvery) => {
    const simulated = simulateTcp(link, 1500, mpdus, loss, ackEvery, 20_000, 15);
    const model = goodputMbps(link, 1500, mpdus, null, null, loss, `TCP TCPACK=${ackEvery}`);
    expect(Math.abs(simulated / model - 1)).toBeLessThan(0.005);
  });

  it("tells TCP from UDP: the simulation without ACKs is UDP's goodput, above TCP's", () => {
    const udp = goodputMbps("OFDM 54Mbps 5GHz", 1500);
    const tcp = simulateTcp("OFDM 54Mbps 5GHz", 1500, 1, 0, 2, 20_000, 16);
    expect(tcp).toBeLessThan(0.9 * udp);
  });
});
