// Runs after every `npm ci` / `npm install` (package.json "postinstall").
//
// @react-router/dev 7.18.4, the last 7.x release, starts its internal Vite servers (the loader of
// react-router.config.ts and the plugin's child compiler) with `envFile: false`, an option Vite 8.1+ reports as
// deprecated on every typegen, build and dev start, beyond the reach of any config. React Router 8 passes
// `envDir: false` instead (remix-run/react-router#15230); Vite 8 treats the two alike (`envFile === false` sets
// `envDir` to false), so this applies the same one-word change to the installed 7.18.4 files. It touches nothing
// when another version is installed, is safe to run twice, and never fails the install.
import fs from "node:fs";
import path from "node:path";

const PATCHED_VERSION = "7.18.4";
const FILES = ["dist/vite.js", "dist/cli/index.js", "dist/vite/cloudflare.js"];

function patch(packageDir) {
  const manifest = JSON.parse(fs.readFileSync(path.join(packageDir, "package.json"), "utf8"));
  if (manifest.version !== PATCHED_VERSION) return `@react-router/dev ${manifest.version}: left as it is`;
  let replaced = 0;
  for (const file of FILES) {
    const full = path.join(packageDir, file);
    if (!fs.existsSync(full)) continue;
    const before = fs.readFileSync(full, "utf8");
    const after = before.replaceAll("envFile: false", "envDir: false");
    if (after === before) continue;
    replaced += before.split("envFile: false").length - 1;
    fs.writeFileSync(full, after);
  }
  return replaced
    ? `@react-router/dev ${PATCHED_VERSION}: envFile: false -> envDir: false in ${replaced} place(s)`
    : undefined;
}

try {
  const message = patch(path.resolve(process.argv[2] ?? "node_modules/@react-router/dev"));
  if (message) console.log(message);
} catch (error) {
  console.warn(
    `Could not patch @react-router/dev (${error instanceof Error ? error.message : error}); builds will warn about envFile.`,
  );
}
