import { readdirSync, statSync } from "node:fs";
import { join } from "node:path";

/** Every .ts/.tsx file under a directory, for tests that read the code itself. */
export function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return /\.tsx?$/.test(name) ? [path] : [];
  });
}
