// Photos and documents: a presigned PUT to the S3 store, then the server decides from the bytes
// (ASVS 5.2.1 size, 5.2.2 type by magic bytes, 5.3.2 server-chosen key, 5.4.1 server-set
// download name, 3.4.4 nosniff) and who may do any of it (8.2.1, 8.2.2).
import { eq, sql } from "drizzle-orm";
import { PNG } from "pngjs";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as complete } from "@/app/api/patients/[patientId]/uploads/[uploadId]/complete/route";
import { GET as download } from "@/app/api/patients/[patientId]/uploads/[uploadId]/file/route";
import { GET as list, POST as declare } from "@/app/api/patients/[patientId]/uploads/route";
import { db } from "@/db";
import { auditEvents, uploads } from "@/db/schema";
import { headObject, putObject } from "@/lib/storage";
import { patientIdByHrn } from "../support/fixtures";
import { call, sessionFor } from "../support/http";

let halina: string;
let arthur: string;
let nurse: string;

function pngBytes(): Buffer {
  const png = new PNG({ width: 4, height: 4 });
  png.data.fill(200);
  return PNG.sync.write(png);
}
const pdfBytes = () => Buffer.from("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n", "latin1");
const htmlBytes = () => Buffer.from("<!doctype html><html><body><script>alert(document.cookie)</script></body></html>");
const svgBytes = () => Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');

type Declared = { upload: { id: string; status: string }; uploadUrl: string; uploadHeaders: Record<string, string> };

async function start(patientId: string, body: Record<string, unknown>, cookie = nurse) {
  return call(declare, `/api/patients/${patientId}/uploads`, { cookie, body, params: { patientId } });
}

async function putTo(d: Declared, bytes: Buffer, contentType: string) {
  return fetch(d.uploadUrl, { method: "PUT", body: new Uint8Array(bytes), headers: { ...d.uploadHeaders, "Content-Type": contentType } });
}

async function finish(patientId: string, uploadId: string, cookie = nurse) {
  return call(complete, `/api/patients/${patientId}/uploads/${uploadId}/complete`, { cookie, body: {}, params: { patientId, uploadId } });
}

async function uploadCount() {
  const [r] = await db.select({ n: sql<number>`count(*)::int` }).from(uploads);
  return r.n;
}

async function keyOf(uploadId: string) {
  const [r] = await db.select({ key: uploads.objectKey, status: uploads.status }).from(uploads).where(eq(uploads.id, uploadId));
  return r;
}

beforeAll(async () => {
  halina = await patientIdByHrn("EM-100-002");
  arthur = await patientIdByHrn("EM-100-001");
  nurse = await sessionFor("communityNurse");
});

describe("a PNG photo, declared, sent and checked", () => {
  let id: string;
  const bytes = pngBytes();

  it("declares it: 201, pending, a presigned PUT for a key the server chose", async () => {
    const res = await start(halina, { category: "packaging-label", label: "Label of today's catheter", contentType: "image/png", sizeBytes: bytes.length });
    expect(res.status).toBe(201);
    const body = (await res.json()) as Declared;
    expect(body.upload.status).toBe("pending");
    id = body.upload.id;
    const { key } = await keyOf(id);
    expect(key).toMatch(new RegExp(`^patients/${halina}/[0-9a-f-]{36}$`));
    expect(new URL(body.uploadUrl).pathname).toContain(key);
    expect(JSON.stringify(body.upload)).not.toContain(key);
    const put = await putTo(body, bytes, "image/png");
    expect(put.status).toBe(200);
  });

  it("completes it: the bytes are a PNG, so it is ready with the verified type and real size", async () => {
    const res = await finish(halina, id);
    expect(res.status).toBe(200);
    expect((await res.json()).upload).toMatchObject({ id, status: "ready", contentType: "image/png", sizeBytes: bytes.length, isImage: true });
    // Completing again changes nothing.
    expect((await (await finish(halina, id)).json()).upload.status).toBe("ready");
  });

  it("lists it without its object key", async () => {
    const res = await call(list, `/api/patients/${halina}/uploads`, { cookie: nurse, params: { patientId: halina } });
    expect(res.status).toBe(200);
    const text = await res.text();
    const { uploads: rows } = JSON.parse(text);
    expect(rows.find((u: { id: string }) => u.id === id)).toMatchObject({ label: "Label of today's catheter", uploadedByName: "Grace Mensah" });
    expect(text).not.toContain("patients/");
  });

  it("downloads it through the app: attachment with a server-set name, nosniff, the verified type", async () => {
    const res = await call(download, `/api/patients/${halina}/uploads/${id}/file`, { cookie: nurse, params: { patientId: halina, uploadId: id } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("image/png");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="caddis-packaging-label-\d{4}-\d{2}-\d{2}\.png"$/);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("cache-control")).toContain("no-store");
    expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true);
    const [audited] = await db
      .select({ n: sql<number>`count(*)::int` })
      .from(auditEvents)
      .where(sql`${auditEvents.action} = 'upload.download' and ${auditEvents.details}->>'uploadId' = ${id}`);
    expect(audited.n).toBe(1);
  });

  it("?inline=1 shows an image in place, still nosniff and sandboxed", async () => {
    const res = await call(download, `/api/patients/${halina}/uploads/${id}/file?inline=1`, { cookie: nurse, params: { patientId: halina, uploadId: id } });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toMatch(/^inline; /);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("content-security-policy")).toMatch(/^sandbox/);
  });
});

describe("files that are refused", () => {
  it("a PDF discharge letter is fine, and ?inline=1 still downloads it as an attachment", async () => {
    const bytes = pdfBytes();
    const d = (await (await start(halina, { category: "discharge-letter", label: "Discharge letter", contentType: "application/pdf", sizeBytes: bytes.length })).json()) as Declared;
    expect((await putTo(d, bytes, "application/pdf")).status).toBe(200);
    expect((await finish(halina, d.upload.id)).status).toBe(200);
    const res = await call(download, `/api/patients/${halina}/uploads/${d.upload.id}/file?inline=1`, {
      cookie: nurse,
      params: { patientId: halina, uploadId: d.upload.id },
    });
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="caddis-discharge-letter-.*\.pdf"$/);
  });

  it("HTML that says it is a PNG: 415 on completion, the object deleted from the store, marked rejected", async () => {
    const bytes = htmlBytes();
    const d = (await (await start(halina, { category: "site-photo", label: "Site photo", contentType: "image/png", sizeBytes: bytes.length })).json()) as Declared;
    expect((await putTo(d, bytes, "image/png")).status).toBe(200);
    const { key } = await keyOf(d.upload.id);
    expect(await headObject({ key })).not.toBeNull();
    const res = await finish(halina, d.upload.id);
    expect(res.status).toBe(415);
    expect((await res.json()).error.code).toBe("unsupported_media_type");
    expect(await headObject({ key })).toBeNull();
    expect((await keyOf(d.upload.id)).status).toBe("rejected");
    // Nothing to download.
    const dl = await call(download, `/api/patients/${halina}/uploads/${d.upload.id}/file`, { cookie: nurse, params: { patientId: halina, uploadId: d.upload.id } });
    expect(dl.status).toBe(404);
  });

  it("SVG declared as SVG: 415 at once, nothing written", async () => {
    const before = await uploadCount();
    const res = await start(halina, { category: "other", label: "Drawing", contentType: "image/svg+xml", sizeBytes: svgBytes().length });
    expect(res.status).toBe(415);
    expect(await uploadCount()).toBe(before);
  });

  it("SVG (or HTML) declared as text/html or as a PNG: refused either way", async () => {
    expect((await start(halina, { category: "other", label: "Page", contentType: "text/html", sizeBytes: 100 })).status).toBe(415);
    const bytes = svgBytes();
    const d = (await (await start(halina, { category: "other", label: "Drawing", contentType: "image/png", sizeBytes: bytes.length })).json()) as Declared;
    expect((await putTo(d, bytes, "image/png")).status).toBe(200);
    expect((await finish(halina, d.upload.id)).status).toBe(415);
    expect(await headObject({ key: (await keyOf(d.upload.id)).key })).toBeNull();
  });

  it("a real PNG declared as a JPEG: a mismatch, refused", async () => {
    const bytes = pngBytes();
    const d = (await (await start(halina, { category: "site-photo", label: "Photo", contentType: "image/jpeg", sizeBytes: bytes.length })).json()) as Declared;
    expect((await putTo(d, bytes, "image/jpeg")).status).toBe(200);
    expect((await finish(halina, d.upload.id)).status).toBe(415);
  });

  it("over 10 MB declared: 413, nothing written", async () => {
    const before = await uploadCount();
    const res = await start(halina, { category: "discharge-letter", label: "Scan", contentType: "application/pdf", sizeBytes: 10 * 1024 * 1024 + 1 });
    expect(res.status).toBe(413);
    expect(await uploadCount()).toBe(before);
  });

  it("over 10 MB arriving under a small declaration: 413 on completion, and removed", async () => {
    const d = (await (await start(halina, { category: "discharge-letter", label: "Scan", contentType: "application/pdf", sizeBytes: 1000 })).json()) as Declared;
    const { key } = await keyOf(d.upload.id);
    // As a store that ignored the signed length would keep it.
    const big = Buffer.alloc(10 * 1024 * 1024 + 10, 0x20);
    pdfBytes().copy(big);
    await putObject({ key, body: big, contentType: "application/pdf" });
    const res = await finish(halina, d.upload.id);
    expect(res.status).toBe(413);
    expect(await headObject({ key })).toBeNull();
    expect((await keyOf(d.upload.id)).status).toBe("rejected");
  });

  it("signs the declared size and type into the PUT, and keeps the real size whatever was declared", async () => {
    const bytes = pngBytes();
    const d = (await (await start(halina, { category: "site-photo", label: "Photo", contentType: "image/png", sizeBytes: bytes.length + 5 })).json()) as Declared;
    // S3 refuses a PUT whose Content-Length or Content-Type differs from the signed ones. The local
    // fake (s3rver) does not check signed headers, so the server's own check below is what counts.
    const signed = new URL(d.uploadUrl).searchParams.get("X-Amz-SignedHeaders")!.split(";");
    expect(signed).toEqual(expect.arrayContaining(["content-length", "content-type", "host"]));
    await putTo(d, bytes, "image/png");
    const res = await finish(halina, d.upload.id);
    expect((await res.json()).upload.sizeBytes).toBe(bytes.length);
  });

  it("completing before the file arrived: 409, still pending", async () => {
    const d = (await (await start(halina, { category: "site-photo", label: "Photo", contentType: "image/png", sizeBytes: 100 })).json()) as Declared;
    expect((await finish(halina, d.upload.id)).status).toBe(409);
    expect((await keyOf(d.upload.id)).status).toBe("pending");
  });
});

describe("bad input and access", () => {
  it("400 with every field error, nothing written", async () => {
    const before = await uploadCount();
    const res = await start(halina, { category: "selfie", label: "", sizeBytes: -1 });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(error.code).toBe("validation_failed");
    expect(Object.keys(error.fields).sort()).toEqual(["category", "contentType", "label", "sizeBytes"]);
    expect((await start(halina, { category: "other", label: "x", contentType: "image/png", sizeBytes: 10, objectKey: "../../etc" })).status).toBe(400);
    expect(await uploadCount()).toBe(before);
  });

  it("another organisation's clinician: 404 on every route; anonymous 401", async () => {
    const ward = await sessionFor("wardNurse");
    const [any] = await db.select({ id: uploads.id }).from(uploads).where(eq(uploads.patientId, halina)).limit(1);
    const body = { category: "other", label: "x", contentType: "image/png", sizeBytes: 10 };
    expect((await start(halina, body, ward)).status).toBe(404);
    expect((await call(list, `/api/patients/${halina}/uploads`, { cookie: ward, params: { patientId: halina } })).status).toBe(404);
    expect((await finish(halina, any.id, ward)).status).toBe(404);
    expect((await call(download, `/api/patients/${halina}/uploads/${any.id}/file`, { cookie: ward, params: { patientId: halina, uploadId: any.id } })).status).toBe(404);
    expect((await call(declare, `/api/patients/${halina}/uploads`, { body, params: { patientId: halina } })).status).toBe(401);
    expect((await call(list, `/api/patients/${halina}/uploads`, { params: { patientId: halina } })).status).toBe(401);
  });

  it("an upload id of another patient is not found under this one", async () => {
    const [any] = await db.select({ id: uploads.id }).from(uploads).where(eq(uploads.patientId, halina)).limit(1);
    const res = await call(download, `/api/patients/${arthur}/uploads/${any.id}/file`, { cookie: nurse, params: { patientId: arthur, uploadId: any.id } });
    expect(res.status).toBe(404);
  });

  it("patient and carer may add a site photo of their own patient, nothing else; never list or download", async () => {
    const bytes = pngBytes();
    for (const who of ["patient", "carer"] as const) {
      const cookie = await sessionFor(who);
      const ok = await start(arthur, { category: "site-photo", label: "My site", contentType: "image/png", sizeBytes: bytes.length }, cookie);
      expect(ok.status, who).toBe(201);
      const d = (await ok.json()) as Declared;
      expect((await putTo(d, bytes, "image/png")).status).toBe(200);
      expect((await finish(arthur, d.upload.id, cookie)).status, who).toBe(200);
      expect((await start(arthur, { category: "discharge-letter", label: "Letter", contentType: "application/pdf", sizeBytes: 10 }, cookie)).status, who).toBe(403);
      expect((await call(list, `/api/patients/${arthur}/uploads`, { cookie, params: { patientId: arthur } })).status, who).toBe(403);
      expect(
        (await call(download, `/api/patients/${arthur}/uploads/${d.upload.id}/file`, { cookie, params: { patientId: arthur, uploadId: d.upload.id } })).status,
        who,
      ).toBe(403);
    }
    // Not someone else's patient: 404.
    const other = await sessionFor("patientAr");
    expect((await start(arthur, { category: "site-photo", label: "x", contentType: "image/png", sizeBytes: 10 }, other)).status).toBe(404);
  });

  it("a patient cannot finish an upload a nurse started", async () => {
    const d = (await (await start(arthur, { category: "site-photo", label: "Nurse photo", contentType: "image/png", sizeBytes: 100 })).json()) as Declared;
    expect((await finish(arthur, d.upload.id, await sessionFor("patient"))).status).toBe(404);
  });

  it("admin: 403 on every route", async () => {
    const admin = await sessionFor("admin");
    const [any] = await db.select({ id: uploads.id }).from(uploads).where(eq(uploads.patientId, halina)).limit(1);
    expect((await start(halina, { category: "other", label: "x", contentType: "image/png", sizeBytes: 10 }, admin)).status).toBe(403);
    expect((await call(list, `/api/patients/${halina}/uploads`, { cookie: admin, params: { patientId: halina } })).status).toBe(403);
    expect((await finish(halina, any.id, admin)).status).toBe(403);
    expect((await call(download, `/api/patients/${halina}/uploads/${any.id}/file`, { cookie: admin, params: { patientId: halina, uploadId: any.id } })).status).toBe(403);
  });
});
