/**
 * Command line for the contention simulator: runs the seeded Monte Carlo of
 * saturated stations on a link and prints it beside the analytic model.
 *
 *   npx tsx scripts/simulate.ts --link "HE MCS7 1SS 20MHz 5GHz" --stations 10
 *   npx tsx scripts/simulate.ts --link "OFDM 54Mbps 5GHz" --mix "VO:2,BE:8" --protection RTS --busy-slots 500000
 *
 * Options: --link TEXT (default "OFDM 54Mbps 5GHz"), --stations N (one class,
 * default 10), --access AC (default BE), --mix "AC:N,AC:N" (several classes;
 * replaces --stations/--access), --packet-bytes N (1500), --mpdus N|auto,
 * --protection none|RTS|CTS, --mac-options TEXT, --seed N (1),
 * --busy-slots N (200000) or --duration-s S (simulated channel time).
 * A progress bar goes to stderr; the table to stdout.
 */
import { contentionChannel, edcaSaturation, simulate, type ClassSpec } from "../src/core/contention";
import { AirtallyError } from "../src/core/errors";

interface Options {
  link: string;
  classes: ClassSpec[];
  packetBytes: number;
  mpdus: string | number;
  protection: string;
  macOptions: string;
  seed: number;
  busySlots?: number;
  durationUs?: number;
}

function parseArgs(argv: readonly string[]): Options {
  const get = new Map<string, string>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith("--")) throw new Error(`unexpected argument "${a}"; options start with --`);
    const value = argv[i + 1];
    if (value === undefined || value.startsWith("--")) throw new Error(`${a} needs a value`);
    get.set(a.slice(2), value);
    i++;
  }
  const num = (name: string, fallback?: number): number | undefined => {
    const v = get.get(name);
    if (v === undefined) return fallback;
    const n = Number(v);
    if (!Number.isFinite(n)) throw new Error(`--${name}: expected a number, got "${v}"`);
    return n;
  };
  const classes: ClassSpec[] = get.has("mix")
    ? (get.get("mix") as string).split(",").map((part) => {
        const [access, count] = part.split(":").map((s) => s.trim());
        const stations = Number(count);
        if (!access || !Number.isInteger(stations)) throw new Error(`--mix: expected "AC:N,AC:N" such as "VO:2,BE:8", got "${part}"`);
        return { access, stations };
      })
    : [{ access: get.get("access") ?? "BE", stations: num("stations", 10) as number }];
  const mpdus = get.get("mpdus") ?? "auto";
  const durationS = num("duration-s");
  return {
    link: get.get("link") ?? "OFDM 54Mbps 5GHz",
    classes,
    packetBytes: num("packet-bytes", 1500) as number,
    mpdus: mpdus === "auto" ? "auto" : Number(mpdus),
    protection: get.get("protection") ?? "none",
    macOptions: get.get("mac-options") ?? "",
    seed: num("seed", 1) as number,
    busySlots: num("busy-slots", durationS === undefined ? 200_000 : undefined),
    durationUs: durationS === undefined ? undefined : durationS * 1e6,
  };
}

function progressBar(fraction: number): void {
  const width = 40;
  const done = Math.round(fraction * width);
  process.stderr.write(`\r[${"#".repeat(done)}${".".repeat(width - done)}] ${(fraction * 100).toFixed(0).padStart(3)}%`);
  if (fraction >= 1) process.stderr.write("\n");
}

function main(): void {
  const o = parseArgs(process.argv.slice(2));
  const channel = contentionChannel(o.link, o.classes, o.packetBytes, o.mpdus, o.protection, o.macOptions);
  const long = (o.busySlots ?? 0) >= 100_000 || (o.durationUs ?? 0) >= 10e6;
  const sim = simulate(channel, o.seed, {
    busySlots: o.busySlots,
    durationUs: o.durationUs,
    progressEvery: 10_000,
    onProgress: long ? progressBar : undefined,
  });
  const model = edcaSaturation(channel);
  const rows = [["class", "stations", "sim Mb/s", "model Mb/s", "sim p", "model p", "sim airtime", "model airtime", "drops"]];
  sim.classes.forEach((s, i) => {
    const m = model.classes[i];
    rows.push([s.name, String(s.stations), s.goodputMbps.toFixed(3), m.goodputMbps.toFixed(3), s.collisionProbability.toFixed(4), m.p.toFixed(4), s.airtimeShare.toFixed(4), m.airtimeShare.toFixed(4), String(s.drops)]);
  });
  const total = model.classes.reduce((a, c) => a + c.goodputMbps, 0);
  rows.push(["total", String(sim.classes.reduce((a, c) => a + c.stations, 0)), sim.goodputMbps.toFixed(3), total.toFixed(3), "", "", "", "", ""]);
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => r[j].length)));
  console.log(`${o.link}, ${o.packetBytes}-byte packets, protection ${o.protection}, seed ${o.seed}: ${sim.busySlots} busy slots, ${(sim.durationUs / 1e6).toFixed(3)} s of channel time`);
  for (const r of rows) console.log(r.map((c, j) => (j === 0 ? c.padEnd(widths[j]) : c.padStart(widths[j]))).join("  "));
  console.log(`contention share: sim ${sim.contentionShare.toFixed(4)}, model ${model.contentionShare.toFixed(4)}`);
}

try {
  main();
} catch (e) {
  if (e instanceof AirtallyError || e instanceof Error) {
    console.error(`simulate: ${e.message}`);
    process.exit(2);
  }
  throw e;
}
