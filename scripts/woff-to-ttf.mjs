// Unwraps a WOFF 1.0 file into the plain TrueType (sfnt) it carries.
// WOFF File Format 1.0, W3C Recommendation 2012, §4–§5: a 44-byte header, then one
// 20-byte directory entry per table (tag, offset, compLength, origLength, origChecksum);
// a table is zlib-compressed when compLength < origLength.
// Usage: node scripts/woff-to-ttf.mjs in.woff out.ttf
import { readFileSync, writeFileSync } from "node:fs";
import { inflateSync } from "node:zlib";

const [, , input, output] = process.argv;
if (!input || !output) {
  console.error("usage: node scripts/woff-to-ttf.mjs in.woff out.ttf");
  process.exit(2);
}
const woff = readFileSync(input);
if (woff.toString("latin1", 0, 4) !== "wOFF") throw new Error(`${input} is not a WOFF 1.0 file`);
const flavor = woff.readUInt32BE(4);
const numTables = woff.readUInt16BE(12);
const tables = [];
for (let i = 0; i < numTables; i++) {
  const at = 44 + i * 20;
  const tag = woff.toString("latin1", at, at + 4);
  const offset = woff.readUInt32BE(at + 4);
  const compLength = woff.readUInt32BE(at + 8);
  const origLength = woff.readUInt32BE(at + 12);
  const checksum = woff.readUInt32BE(at + 16);
  const raw = woff.subarray(offset, offset + compLength);
  const data = compLength < origLength ? inflateSync(raw) : Buffer.from(raw);
  if (data.length !== origLength) throw new Error(`table ${tag}: length mismatch`);
  tables.push({ tag, checksum, data });
}
tables.sort((a, b) => (a.tag < b.tag ? -1 : 1));
let entrySelector = 0;
while (2 ** (entrySelector + 1) <= numTables) entrySelector++;
const searchRange = 2 ** entrySelector * 16;
const head = Buffer.alloc(12 + 16 * numTables);
head.writeUInt32BE(flavor, 0);
head.writeUInt16BE(numTables, 4);
head.writeUInt16BE(searchRange, 6);
head.writeUInt16BE(entrySelector, 8);
head.writeUInt16BE(numTables * 16 - searchRange, 10);
let offset = head.length;
const bodies = [];
tables.forEach((t, i) => {
  const at = 12 + i * 16;
  head.write(t.tag, at, "latin1");
  head.writeUInt32BE(t.checksum, at + 4);
  head.writeUInt32BE(offset, at + 8);
  head.writeUInt32BE(t.data.length, at + 12);
  const padded = Buffer.alloc((t.data.length + 3) & ~3);
  t.data.copy(padded);
  bodies.push(padded);
  offset += padded.length;
});
writeFileSync(output, Buffer.concat([head, ...bodies]));
