// The booklet from the portal: the patient and their carer download it (nobody else), without
// the QR and passport code of the printed copy, and its patient pages ("When to get help") in the
// reader's own text size (read back from the PDF's word boxes with poppler).
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { GET as getBooklet } from "@/app/api/portal/booklet/route";
import { PUT as putReading } from "@/app/api/account/reading/route";
import { patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-portal-booklet-"));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

async function download(cookie: string, query = "") {
  const res = await call(getBooklet, `/api/portal/booklet${query}`, { cookie });
  return res;
}

/** Height in points of the word "Call" opening the emergency box, and the whole text. */
function read(pdf: Buffer, name: string) {
  const file = path.join(dir, `${name}.pdf`);
  fs.writeFileSync(file, pdf);
  const html = execFileSync("pdftotext", ["-bbox", file, "-"], { encoding: "utf8" });
  const call = [...html.matchAll(/<word xMin="[\d.]+" yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)">Call<\/word>/g)].map((m) => Number(m[2]) - Number(m[1]));
  return { callHeight: call[0], text: execFileSync("pdftotext", [file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ") };
}

describe("the booklet from the portal", () => {
  it("the patient downloads it without the QR and code; the help pages follow their text size", async () => {
    const patient = await sessionFor("patient");
    const plain = await download(patient);
    expect(plain.status).toBe(200);
    expect(plain.headers.get("content-type")).toBe("application/pdf");
    expect(plain.headers.get("content-disposition")).toMatch(/^attachment; filename="caddis-booklet-\d{4}-\d{2}-\d{2}\.pdf"$/);
    const small = read(Buffer.from(await plain.arrayBuffer()), "plain");
    expect(small.text).toContain("Arthur Pell");
    expect(small.text).toContain("Call 999 now if you:");
    // The passport code and the scan hint are on the printed booklet only.
    expect(small.text).not.toContain("Scan for the catheter details");
    expect(small.text).not.toMatch(/[A-Z0-9]{4}-[A-Z0-9]{4}-[A-Z0-9]{4}/);

    expect((await call(putReading, "/api/account/reading", { method: "PUT", cookie: patient, body: { textSize: 3, contrast: "high" } })).status).toBe(200);
    try {
      const big = read(Buffer.from(await (await download(patient)).arrayBuffer()), "big");
      // 200 %: twice the size (word boxes from the font's extent, so compared as a ratio).
      expect(big.callHeight / small.callHeight).toBeGreaterThan(1.8);
      expect(big.callHeight / small.callHeight).toBeLessThan(2.2);
      expect(big.text).toContain("Call 999 now if you:");
    } finally {
      await call(putReading, "/api/account/reading", { method: "PUT", cookie: patient, body: { textSize: 0, contrast: "standard" } });
    }
  });

  it("a carer downloads their patient's booklet; another patient's is not found; staff are refused", async () => {
    const carer = await sessionFor("carer");
    const arthur = await patientIdByHrn("EM-100-001");
    const yusuf = await patientIdByHrn("EM-100-003");
    const res = await download(carer, `?patient=${arthur}`);
    expect(res.status).toBe(200);
    expect(read(Buffer.from(await res.arrayBuffer()), "carer").text).toContain("Arthur Pell");
    expect((await download(carer, `?patient=${yusuf}`)).status).toBe(404);
    expect((await download(await sessionFor("patient"), `?patient=${yusuf}`)).status).toBe(404);
    expect((await download(carer, "?patient=not-an-id")).status).toBe(404);
    expect((await download(await sessionFor("communityNurse"), `?patient=${arthur}`)).status).toBe(403);
    expect((await call(getBooklet, "/api/portal/booklet")).status).toBe(401);
  });
});
