import QRCode from "qrcode";

/**
 * A QR code as one SVG path in module units (a square of `size` modules), drawn by the
 * PDF as vector graphics: crisp at any zoom and in print.
 */
export function qrPath(textToEncode: string): { size: number; d: string } {
  const qr = QRCode.create(textToEncode, { errorCorrectionLevel: "M" });
  const n = qr.modules.size;
  let d = "";
  for (let y = 0; y < n; y++) {
    let x = 0;
    while (x < n) {
      if (!qr.modules.get(y, x)) {
        x++;
        continue;
      }
      const start = x;
      while (x < n && qr.modules.get(y, x)) x++;
      d += `M${start} ${y}h${x - start}v1h${start - x}z`;
    }
  }
  return { size: n, d };
}
