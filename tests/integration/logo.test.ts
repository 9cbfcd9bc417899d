import { deflateSync, crc32 } from "node:zlib";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { and, eq } from "drizzle-orm";
import { closeDb, db } from "@/db/client";
import { auditEvents, organisations, uploads } from "@/db/schema";
import { uploadLogoAction } from "@/app/(app)/admin/organisation/actions";
import { checkLogo, jpegSize, pngSize } from "@/lib/pdf/logo-image";
import { pdfOrganisation } from "@/lib/pdf/load";
import { renderSheetPdf } from "@/lib/pdf/render";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// The logo upload through the real server action (session replaced by the user set in
// `session`), its checks by content, the stored file, the audit event, and a PDF with it.
const session = vi.hoisted(() => ({ userId: null as number | null }));
vi.mock("next-auth", async (importOriginal) => ({
  ...(await importOriginal<typeof import("next-auth")>()),
  getServerSession: async () => (session.userId ? { user: { id: session.userId } } : null),
}));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}

/** A real, decodable PNG: w × h pixels of one RGB colour. */
function png(w: number, h: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(w, 0);
  ihdr.writeUInt32BE(h, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type RGB
  const row = Buffer.concat([Buffer.from([0]), Buffer.alloc(w * 3, 0x5a)]);
  const raw = Buffer.concat(Array.from({ length: h }, () => row));
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk("IHDR", ihdr), chunk("IDAT", deflateSync(raw)), chunk("IEND", Buffer.alloc(0))]);
}

/** JPEG headers only (SOI, APP0, SOF0 with the size, EOI): enough for the size check. */
function jpegHeader(w: number, h: number, padTo = 0): Buffer {
  const app0 = Buffer.from([0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00]);
  const sof = Buffer.from([0xff, 0xc0, 0x00, 0x11, 0x08, h >> 8, h & 255, w >> 8, w & 255, 0x03, 1, 0x22, 0, 2, 0x11, 1, 3, 0x11, 1]);
  const body = Buffer.concat([Buffer.from([0xff, 0xd8]), app0, sof]);
  const pad = padTo > body.length ? Buffer.alloc(padTo - body.length - 2) : Buffer.alloc(0);
  return Buffer.concat([body, pad, Buffer.from([0xff, 0xd9])]);
}

function form(data: Buffer, name: string, type = "application/octet-stream"): FormData {
  const f = new FormData();
  f.set("logo", new File([new Uint8Array(data)], name, { type }));
  return f;
}

let admin: TestUser;
let lead: TestUser;

beforeAll(async () => {
  const org = await makeOrg("Copperleaf Assemblies");
  admin = await makeUser(org.id, "admin");
  lead = await makeUser(org.id, "lead");
});

afterAll(async () => {
  await closeDb();
});

describe("logo checks by content", () => {
  it("reads PNG and JPEG sizes and refuses anything else", () => {
    expect(pngSize(png(40, 12))).toEqual({ width: 40, height: 12 });
    expect(jpegSize(jpegHeader(640, 480))).toEqual({ width: 640, height: 480 });
    expect(checkLogo(png(40, 12))).toMatchObject({ ok: true, format: "png", contentType: "image/png" });
    expect(checkLogo(jpegHeader(2000, 2000))).toMatchObject({ ok: true, format: "jpg", contentType: "image/jpeg", width: 2000, height: 2000 });
    expect(checkLogo(Buffer.from("hello, I am text"))).toMatchObject({ ok: false, message: expect.stringMatching(/not a PNG or JPEG/) });
    expect(checkLogo(Buffer.alloc(0))).toMatchObject({ ok: false });
    expect(checkLogo(png(2001, 10))).toMatchObject({ ok: false, message: "Logo: the image is 2001 × 10 px; at most 2000 × 2000 px is allowed" });
    expect(checkLogo(jpegHeader(100, 2400))).toMatchObject({ ok: false, message: expect.stringMatching(/100 × 2400 px/) });
    expect(checkLogo(jpegHeader(100, 100, 1024 * 1024 + 10))).toMatchObject({ ok: false, message: expect.stringMatching(/at most 1 MB/) });
    // Exactly 1 MB is allowed.
    expect(checkLogo(jpegHeader(100, 100, 1024 * 1024))).toMatchObject({ ok: true });
  });
});

describe("logo upload action", () => {
  it("stores a PNG (even named .jpg), points the organisation at it, records the event, and prints it in PDFs", async () => {
    session.userId = admin.id;
    const data = png(120, 40);
    const r = await uploadLogoAction(form(data, "brand.jpg", "image/jpeg"));
    expect(r).toMatchObject({ ok: true, data: { width: 120, height: 40, contentType: "image/png" } });
    if (!r.ok) return;
    const [org] = await db().select({ logo: organisations.logoUploadId }).from(organisations).where(eq(organisations.id, admin.organisationId));
    expect(org?.logo).toBe(r.data.uploadId);
    const [file] = await db().select().from(uploads).where(eq(uploads.id, r.data.uploadId));
    expect(file).toMatchObject({ kind: "logo", contentType: "image/png", sizeBytes: data.length, organisationId: admin.organisationId });
    expect(Buffer.compare(file!.data, data)).toBe(0);
    const events = await db()
      .select({ details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.organisationId, admin.organisationId), eq(auditEvents.event, "organisation.logo_uploaded")));
    expect(events).toHaveLength(1);
    expect(events[0]!.details).toMatchObject({ uploadId: r.data.uploadId, sha256: file!.sha256 });

    const branding = await pdfOrganisation(admin.organisationId);
    expect(branding.logo?.format).toBe("png");
    const pdf = await renderSheetPdf({
      organisation: branding,
      project: { code: "CLA-1", name: "Logo check", client: "", site: "", unitSystem: "metric" },
      sheet: { id: 1, tag: "EH-01", title: "Heat", kind: "enclosure-heat", kindTitle: "Enclosure heat" },
      revision: { ordinal: 0, label: "A", status: "draft", authorName: "A. Person", checkedByName: null, createdAt: new Date(), submittedAt: null, decidedAt: null, engineVersion: "1.0.0", contentHash: "0".repeat(64), inputs: {}, results: null },
      verification: null,
    });
    // The logo is embedded as an image XObject.
    expect(pdf.toString("latin1")).toMatch(/\/Subtype \/Image/);
  });

  it("refuses a text file named .png, a too large image and a non-admin, with a message on the field", async () => {
    session.userId = admin.id;
    const text = await uploadLogoAction(form(Buffer.from("not an image at all"), "logo.png", "image/png"));
    expect(text).toMatchObject({ ok: false, error: { code: "validation", fields: { logo: expect.stringMatching(/not a PNG or JPEG/) } } });
    const big = await uploadLogoAction(form(png(2100, 20), "wide.png", "image/png"));
    expect(big).toMatchObject({ ok: false, error: { fields: { logo: expect.stringMatching(/2100 × 20 px/) } } });
    const heavy = await uploadLogoAction(form(jpegHeader(10, 10, 1_500_000), "heavy.jpg", "image/jpeg"));
    expect(heavy).toMatchObject({ ok: false, error: { fields: { logo: expect.stringMatching(/at most 1 MB/) } } });
    const none = await uploadLogoAction(new FormData());
    expect(none).toMatchObject({ ok: false, error: { fields: { logo: "Logo: choose a PNG or JPEG file" } } });
    session.userId = lead.id;
    expect(await uploadLogoAction(form(png(10, 10), "l.png"))).toMatchObject({ ok: false, error: { code: "forbidden" } });
    const count = await db().select({ id: uploads.id }).from(uploads).where(and(eq(uploads.organisationId, admin.organisationId), eq(uploads.kind, "logo")));
    expect(count).toHaveLength(1);
  });
});
