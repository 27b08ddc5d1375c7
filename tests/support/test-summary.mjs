// Sums the stages of tests/run.sh into one closing line, `N passed, N failed`, and exits 1 when anything failed.
// Usage: node tests/support/test-summary.mjs <results folder>
// The folder holds, per stage in run order, `<n>-<name>.exit` (the stage's exit code) and, for vitest stages,
// `<n>-<name>.json` (vitest's JSON report). A stage with a report counts its tests; a stage without one (types,
// build) counts as one test. A file that failed to load, an error outside any test, a crash before the report
// was written, or a stage that was not run because an earlier one it needs failed, each count as one failure.
import fs from "node:fs";
import path from "node:path";

/** What one stage contributes: { passed, failed, note }. */
export function countStage(exitCode, report) {
  if (!report) {
    if (exitCode === 0) return { passed: 1, failed: 0, note: "ok" };
    return { passed: 0, failed: 1, note: exitCode === null ? "not run" : `exit code ${exitCode}` };
  }
  const passed = report.numPassedTests ?? 0;
  let failed = report.numFailedTests ?? 0;
  // A test file that could not be loaded has no failed test of its own.
  const brokenFiles = (report.testResults ?? []).filter(
    (file) => file.status === "failed" && !(file.assertionResults ?? []).some((test) => test.status === "failed"),
  ).length;
  failed += brokenFiles;
  const notes = [];
  if (brokenFiles) notes.push(`${brokenFiles} file(s) failed to load`);
  // Vitest also fails a run for errors outside tests (unhandled rejections): count the run once.
  if (exitCode !== 0 && failed === 0) {
    failed = 1;
    notes.push(`exit code ${exitCode} with no failed test: an error outside the tests`);
  }
  return { passed, failed, note: notes.join("; ") || (failed ? "" : "ok") };
}

function readJson(file) {
  try {
    return JSON.parse(fs.readFileSync(file, "utf8"));
  } catch {
    return undefined;
  }
}

function main(dir) {
  const stages = fs
    .readdirSync(dir)
    .filter((f) => f.endsWith(".exit"))
    .sort()
    .map((f) => {
      const base = f.slice(0, -".exit".length);
      const text = fs.readFileSync(path.join(dir, f), "utf8").trim();
      const exitCode = text === "not run" ? null : Number(text);
      const isVitest = fs.existsSync(path.join(dir, `${base}.vitest`));
      const report = readJson(path.join(dir, `${base}.json`));
      // A vitest stage that ran but wrote no report crashed: one failure.
      const counted =
        isVitest && !report && exitCode !== null
          ? { passed: 0, failed: 1, note: `no report (exit code ${exitCode})` }
          : countStage(exitCode, report);
      return { name: base.replace(/^\d+-/, ""), ...counted };
    });
  const passed = stages.reduce((sum, s) => sum + s.passed, 0);
  const failed = stages.reduce((sum, s) => sum + s.failed, 0);
  console.log("");
  console.log("== summary");
  for (const s of stages)
    console.log(
      `${s.name.padEnd(8)} ${String(s.passed).padStart(5)} passed ${String(s.failed).padStart(4)} failed  ${s.note}`,
    );
  console.log(`${passed} passed, ${failed} failed`);
  return failed === 0 && stages.length > 0 ? 0 : 1;
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname)) {
  process.exitCode = main(process.argv[2] ?? ".");
}
