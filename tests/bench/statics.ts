// Solves per second of the statics core, single thread, against the editor's targets.
// Run: npx tsx tests/bench/statics.ts
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import type { PlanEdit } from "../../app/plans/editor-state";
import { editorArrangementInput } from "../../app/plans/editor-input";
import type { GearPick } from "../../app/plans/rigging";
import { solveArrangement } from "../../app/statics/arrangement";
import { solveGivenLengths, solveLevel, type LiftPoint } from "../../app/statics/bridle";

export interface BenchResult {
  name: string;
  value: number;
  unit: string;
  target: number;
  ok: boolean;
}

const UP = { x: 0, y: 0, z: 1 };

function ring(n: number): LiftPoint[] {
  return Array.from({ length: n }, (_, i) => {
    const a = (i * 2 * Math.PI) / n + 0.3;
    return {
      id: String.fromCharCode(65 + i),
      position: { x: 0.9 * Math.cos(a) + 0.05 * i, y: 0.6 * Math.sin(a), z: 0.02 * i },
      axis: UP,
    };
  });
}

function measure(run: (i: number) => boolean, minMs = 400): number {
  for (let i = 0; i < 20000; i++) run(i);
  let count = 0;
  const start = performance.now();
  let elapsed = 0;
  while (elapsed < minMs) {
    for (let i = 0; i < 5000; i++) if (run(count + i)) count++;
    elapsed = performance.now() - start;
  }
  return (count / elapsed) * 1000;
}

/** Runs the statics benchmarks: solves per second for 2-4 legs in level and given-lengths mode. */
export async function runStaticsBench(): Promise<BenchResult[]> {
  const results: BenchResult[] = [];
  const targets: Record<number, number> = { 2: 100_000, 3: 100_000, 4: 50_000 };
  for (const n of [2, 3, 4]) {
    // Two legs must straddle the CoG in one vertical plane; 3 and 4 legs sit on an irregular ring.
    const points: LiftPoint[] =
      n === 2
        ? [
            { id: "A", position: { x: 0.9, y: 0, z: 0 }, axis: UP },
            { id: "B", position: { x: -0.7, y: 0, z: 0.05 }, axis: UP },
          ]
        : ring(n);
    const cog = { x: 0.02, y: 0, z: -0.4 };
    // Vary the hook height so nothing is cached or hoisted.
    const level = measure((i) => solveLevel({ massKg: 2000, cog }, points, 1.2 + (i % 100) * 1e-3).ok);
    results.push({
      name: `statics ${n}-leg level`,
      value: level,
      unit: "solves/s",
      target: targets[n]!,
      ok: level >= targets[n]!,
    });
    const first = solveLevel({ massKg: 2000, cog }, points, 1.2);
    if (!first.ok) throw new Error(first.message);
    const lengths = first.solution.legs.map((l) => l.lengthM);
    const varied = lengths.map((l, k) => (k === 0 ? l * 1.01 : l));
    const given = measure((i) => solveGivenLengths({ massKg: 2000, cog }, points, i % 2 === 0 ? lengths : varied).ok);
    const givenTarget = Math.round(targets[n]! / 5);
    results.push({
      name: `statics ${n}-leg given lengths`,
      value: given,
      unit: "solves/s",
      target: givenTarget,
      ok: given >= givenTarget,
    });
  }
  results.push(editorMoveBench());
  return results;
}

/**
 * The editor's move to its figures: the core's input built from the edit and the picks and solved with the
 * checks, as the editor does in the render after each move (a 4-leg level lift, a chain sling leg on each
 * point). Target: 250 a second, 4 ms, a quarter of a 60 Hz frame.
 */
export function editorMoveBench(minMs = 400): BenchResult {
  const points = ring(4);
  const sling = (id: number): GearPick => ({
    id,
    itemCode: `CH-${id}`,
    role: "sling",
    description: "Chain sling 8 mm grade 8",
    wllKg: 2000,
    thread: null,
    lengthM: 2,
    status: "in_service",
    nextDueOn: "2099-01-01",
    massKg: 7,
    spec: {
      role: "sling",
      sling: { kind: "chain", wll: { value: 2000, unit: "kg" }, assemblyLegs: 1, itemCode: `CH-${id}` },
    },
  });
  const picks = new Map(points.map((_, k) => [k + 1, sling(k + 1)]));
  const base: PlanEdit = {
    cog: { x: 0.02, y: 0, z: -0.4 },
    override: null,
    liftPoints: points.map((p) => ({ label: p.id, position: p.position, axis: p.axis, thread: "" })),
    arrangement: {
      kind: "bridle",
      mode: "level",
      liftPointLabels: points.map((p) => p.id),
      hookHeightM: 1.2,
      legLengthsM: {},
    } as PlanEdit["arrangement"],
    rigging: {
      legs: Object.fromEntries(points.map((p, k) => [p.id, { slingItemId: k + 1, hitch: "straight" as const }])),
    },
  };
  const load = {
    massKg: 2000,
    cog: base.cog,
    contingencyPct: 0,
    outlineElevation: [
      [-1, -0.8],
      [1, -0.8],
      [1, 0.2],
      [-1, 0.2],
    ] as Array<[number, number]>,
    fitToleranceDeg: null,
    fitToleranceSource: undefined,
  };
  const context = {
    picks,
    details: { floorClearanceM: 0, liftDate: "" },
    ruleSet: "uk-eu" as const,
    todayIso: "2026-12-03",
    tables: REFERENCE_TABLES,
  };
  const value = measure((i) => {
    // Each move puts lift point A somewhere new, as a drag does.
    const liftPoints = base.liftPoints.map((p, k) =>
      k === 0 ? { ...p, position: { ...p.position, x: p.position.x + (i % 100) * 1e-3 } } : p,
    );
    return (
      solveArrangement(editorArrangementInput({ ...base, liftPoints }, load, context), REFERENCE_TABLES).status === 200
    );
  }, minMs);
  return {
    name: "editor move to figures (4 legs, slings checked)",
    value,
    unit: "moves/s",
    target: 250,
    ok: value >= 250,
  };
}

function format(r: BenchResult): string {
  const fmt = (x: number): string => Math.round(x).toLocaleString("en-US");
  return `${r.name}: ${fmt(r.value)} ${r.unit} (target >= ${fmt(r.target)}) ${r.ok ? "OK" : "BELOW TARGET"}`;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const results = await runStaticsBench();
  for (const r of results) console.log(format(r));
  if (results.some((r) => !r.ok)) process.exitCode = 1;
}
