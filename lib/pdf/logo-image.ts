/**
 * Checks an organisation logo by its content, not its name: PNG or JPEG by the magic
 * bytes, at most 1 MB, at most 2000 × 2000 px read from the PNG IHDR chunk or the
 * JPEG start-of-frame marker. A PNG named .jpg is a PNG; a text file named .png is refused.
 */
export const LOGO_MAX_BYTES = 1024 * 1024;
export const LOGO_MAX_PX = 2000;

export type LogoCheck =
  | { ok: true; format: "png" | "jpg"; contentType: "image/png" | "image/jpeg"; width: number; height: number }
  | { ok: false; message: string };

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

export function pngSize(b: Buffer): { width: number; height: number } | null {
  // Signature, then the first chunk must be IHDR: length 13, type, width, height (big-endian).
  if (b.length < 24 || !b.subarray(0, 8).equals(PNG_SIGNATURE) || b.toString("latin1", 12, 16) !== "IHDR") return null;
  return { width: b.readUInt32BE(16), height: b.readUInt32BE(20) };
}

/** Width and height from the first SOFn marker (baseline, progressive, lossless…; not DHT/JPG/DAC). */
export function jpegSize(b: Buffer): { width: number; height: number } | null {
  if (b.length < 4 || b[0] !== 0xff || b[1] !== 0xd8) return null;
  let i = 2;
  while (i + 4 <= b.length) {
    if (b[i] !== 0xff) return null;
    const marker = b[i + 1]!;
    if (marker === 0xff) {
      i++;
      continue;
    }
    if (marker === 0xd8 || (marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) {
      i += 2;
      continue;
    }
    if (marker === 0xd9 || marker === 0xda) return null;
    const len = b.readUInt16BE(i + 2);
    if (len < 2) return null;
    const isSof = marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
    if (isSof) {
      if (i + 9 > b.length) return null;
      return { height: b.readUInt16BE(i + 5), width: b.readUInt16BE(i + 7) };
    }
    i += 2 + len;
  }
  return null;
}

export function checkLogo(data: Buffer): LogoCheck {
  if (data.length === 0) return { ok: false, message: "Logo: the file is empty; choose a PNG or JPEG image" };
  if (data.length > LOGO_MAX_BYTES) return { ok: false, message: `Logo: the file is ${(data.length / 1024 / 1024).toFixed(2)} MB; at most 1 MB is allowed` };
  const png = pngSize(data);
  const jpg = png ? null : jpegSize(data);
  const size = png ?? jpg;
  if (!size) return { ok: false, message: "Logo: the file is not a PNG or JPEG image (checked by its content, whatever its name)" };
  if (size.width < 1 || size.height < 1) return { ok: false, message: "Logo: the image has no pixels" };
  if (size.width > LOGO_MAX_PX || size.height > LOGO_MAX_PX) {
    return { ok: false, message: `Logo: the image is ${size.width} × ${size.height} px; at most ${LOGO_MAX_PX} × ${LOGO_MAX_PX} px is allowed` };
  }
  return png ? { ok: true, format: "png", contentType: "image/png", ...size } : { ok: true, format: "jpg", contentType: "image/jpeg", ...size };
}
