/**
 * The accuracy sweep of issue 11: the analytic contention models against the
 * seeded simulator over a wide grid, printed as a table with the worst cases.
 * Takes a few minutes; `npx jest` runs a moderate grid of the same checks.
 *
 *   npx tsx scripts/contention-sweep.ts [saturate|mix|all] [--busy-slots N] [--seeds N]
 */
import { contentionChannel, edcaMix, edcaSaturation, saturationGoodputMbps, simulate, type ClassSpec } from "../src/core/contention";
import { AirtallyError } from "../src/core/errors";

/** The catalog's answer, or null where it answers #N/A (beyond the model's checked range). */
function answered<T>(f: () => T): T | null {
  try {
    return f();
  } catch (e) {
    if (e instanceof AirtallyError && e.kind === "na") return null;
    throw e;
  }
}

const args = process.argv.slice(2);
const what = args.find((a) => !a.startsWith("--") && !/^\d+$/.test(a)) ?? "all";
const opt = (name: string, d: number): number => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? Number(args[i + 1]) : d;
};
const BUSY = opt("busy-slots", 60_000);
const SEEDS = opt("seeds", 2);

function simMean(channel: Parameters<typeof simulate>[0]) {
  const runs = Array.from({ length: SEEDS }, (_, k) => simulate(channel, 1000 + k, { busySlots: BUSY }));
  const g = runs.reduce((a, r) => a + r.goodputMbps, 0) / SEEDS;
  const cls = channel.classes.map((_, i) => ({
    g: runs.reduce((a, r) => a + r.classes[i].goodputMbps, 0) / SEEDS,
    p: runs.reduce((a, r) => a + r.classes[i].collisionProbability, 0) / SEEDS,
  }));
  const share = runs.reduce((a, r) => a + r.contentionShare, 0) / SEEDS;
  return { g, cls, share };
}

function saturate(): void {
  const cases: [string, string, string | number, string][] = [
    ["OFDM 54Mbps 5GHz", "DCF", 1, "none"],
    ["OFDM 54Mbps 5GHz", "DCF", 1, "RTS"],
    ["OFDM 54Mbps 5GHz", "BE", 1, "none"],
    ["ERP-OFDM 54Mbps 2.4GHz", "DCF", 1, "none"],
    ["HE MCS7 1SS 20MHz 5GHz", "BE", 1, "none"],
    ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "none"],
    ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "RTS"],
    ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "none BAR"],
    ["HE MCS7 1SS 20MHz 5GHz", "BE", "auto", "RTS BAR"],
    ["HT MCS7 1SS 20MHz 2.4GHz", "BE", 16, "none"],
    ["HT MCS7 1SS 20MHz 2.4GHz", "BE", 16, "none BAR"],
    ["VHT MCS8 1SS 20MHz 5GHz", "VO", "auto", "none"],
    ["VHT MCS8 1SS 20MHz 5GHz", "VO", "auto", "none BAR"],
    ["OFDM 54Mbps 5GHz", "VO", 1, "none"],
    ["HT MCS7 1SS 20MHz 2.4GHz", "VO", 8, "none"],
    ["HE MCS7 1SS 20MHz 5GHz", "VI", "auto", "none"],
    ["HE MCS7 1SS 20MHz 5GHz", "VI", "auto", "none BAR"],
    ["OFDM 54Mbps 5GHz", "VI", 1, "RTS"],
  ];
  let worst = 0;
  let worstP = 0;
  console.log("link | access | mpdus | protection/options | n | model Mb/s | sim Mb/s | err % | model p | sim p | model cont | sim cont");
  for (const [link, access, mpdus, po] of cases) {
    const [prot, ...rest] = po.split(" ");
    for (const n of [1, 2, 5, 10, 20, 35, 50]) {
      const ch = contentionChannel(link, [{ access, stations: n }], 1500, mpdus, prot, rest.join(" "));
      // The one-class model as SATURATE solves it: saturation.ts, or the counter tables for small windows.
      const solved = edcaSaturation(ch);
      const m = { goodputMbps: solved.classes[0].goodputMbps, p: solved.classes[0].p, contentionShare: solved.contentionShare };
      const s = simMean(ch);
      const err = (m.goodputMbps / s.g - 1) * 100;
      if (answered(() => saturationGoodputMbps(link, n, 1500, mpdus, access, prot, rest.join(" "))) === null) {
        console.log(`${link} | ${access} | ${mpdus} | ${po} | ${n} | #N/A (model ${m.goodputMbps.toFixed(3)}) | ${s.g.toFixed(3)} | ${err.toFixed(2)} | ${m.p.toFixed(3)} | ${s.cls[0].p.toFixed(3)} | | `);
        continue;
      }
      worst = Math.max(worst, Math.abs(err));
      worstP = Math.max(worstP, Math.abs(m.p - s.cls[0].p));
      console.log(`${link} | ${access} | ${mpdus} | ${po} | ${n} | ${m.goodputMbps.toFixed(3)} | ${s.g.toFixed(3)} | ${err.toFixed(2)} | ${m.p.toFixed(3)} | ${s.cls[0].p.toFixed(3)} | ${m.contentionShare.toFixed(3)} | ${s.share.toFixed(3)}`);
    }
  }
  console.log(`SATURATE worst |err| ${worst.toFixed(2)} %, worst |Δp| ${worstP.toFixed(3)} (rows answered; #N/A rows left out)`);
}

function mix(): void {
  const link = process.env.MIX_LINK ?? "HE MCS7 1SS 20MHz GI0.8 5GHz";
  const mixes: ClassSpec[][] = [];
  for (const a of [1, 2, 5, 10, 20]) for (const b of [1, 3, 10, 20]) {
    mixes.push([{ access: "VO", stations: a }, { access: "BE", stations: b }]);
    mixes.push([{ access: "VI", stations: a }, { access: "BE", stations: b }]);
    mixes.push([{ access: "BE", stations: a }, { access: "BK", stations: b }]);
  }
  for (const [a, b, c] of [[1, 1, 1], [2, 2, 5], [5, 5, 10], [1, 3, 20], [10, 10, 10], [20, 20, 20]]) {
    mixes.push([{ access: "VO", stations: a }, { access: "VI", stations: b }, { access: "BE", stations: c }]);
  }
  let worstG = 0;
  let worstP = 0;
  let within = 0;
  let rows = 0;
  const opts = process.env.MIX_OPTIONS ?? "";
  console.log("mix | class | model Mb/s | sim Mb/s | err % | model p | sim p");
  for (const mx of mixes) {
    const ch = contentionChannel(link, mx, 1500, "auto", "none", opts);
    const m = edcaSaturation(ch);
    const s = simMean(ch);
    const label = mx.map((x) => `${x.stations}${x.access}`).join("+");
    if (answered(() => edcaMix(link, mx.map((x) => String(x.access)).join(","), mx.map((x) => x.stations).join(","), 1500, "auto", "none", opts)) === null) {
      m.classes.forEach((c, i) => console.log(`${label} | ${c.name} | #N/A (model ${c.goodputMbps.toFixed(3)}) | ${s.cls[i].g.toFixed(3)} | | ${c.p.toFixed(3)} | ${s.cls[i].p.toFixed(3)}`));
      continue;
    }
    m.classes.forEach((c, i) => {
      const sg = s.cls[i].g;
      const err = (c.goodputMbps / sg - 1) * 100;
      const counts = sg < 2 ? Math.abs(c.goodputMbps - sg) > 0.1 : true;
      if (counts) worstG = Math.max(worstG, sg < 2 ? 0 : Math.abs(err));
      worstP = Math.max(worstP, Math.abs(c.p - s.cls[i].p));
      rows++;
      const goodputOk = sg < 2 ? Math.abs(c.goodputMbps - sg) <= 0.1 : Math.abs(err) <= 5;
      if (goodputOk && Math.abs(c.p - s.cls[i].p) <= 0.02) within++;
      console.log(`${mx.map((x) => `${x.stations}${x.access}`).join("+")} | ${c.name} | ${c.goodputMbps.toFixed(3)} | ${sg.toFixed(3)} | ${err.toFixed(2)} | ${c.p.toFixed(3)} | ${s.cls[i].p.toFixed(3)}`);
    });
  }
  console.log(`EDCAMIX worst |err| ${worstG.toFixed(2)} % (classes above 2 Mb/s), worst |Δp| ${worstP.toFixed(3)}; ${within} of ${rows} answered class rows within 5 % (0.1 Mb/s under 2 Mb/s) and 0.02 on p`);
}

if (what === "saturate" || what === "all") saturate();
if (what === "mix" || what === "all") mix();
