// Child process of the bench: times the booklet PDF outside Next.js. Vite's module runner loads
// the TypeScript with the tests' aliases ("@/", and "server-only" allowed off the server bundle).
// Usage: node pdf-child.mjs <patientId> <runs>; prints one JSON line.
import path from "node:path";
import { fileURLToPath } from "node:url";
import { runnerImport } from "vite";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
const { module } = await runnerImport(path.join(root, "scripts/bench/pdf-timing.ts"), {
  configFile: false,
  root,
  logLevel: "error",
  resolve: { alias: { "@/": `${root}/`, "server-only": `${root}/tests/support/server-only.ts` } },
});
const [patientId, runs = "20"] = process.argv.slice(2);
console.log(JSON.stringify(await module.timePassportPdf(patientId, Number(runs))));
process.exit(0);
