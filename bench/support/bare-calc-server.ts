// A bare node:http server around the engine, the baseline of the API benchmark:
// POST /<kind> with a JSON body → runCalc(kind, body) → 200 with the result, or 400
// with the field messages. No framework, no authentication, no database.
// Usage: node --import tsx bench/support/bare-calc-server.ts <port>
import http from "node:http";
import { runCalc } from "../../lib/engine";

const port = Number(process.argv[2]);
if (!Number.isInteger(port) || port < 1 || port > 65535) {
  console.error("usage: bare-calc-server.ts <port from 1 to 65535>");
  process.exit(2);
}

const server = http.createServer((req, res) => {
  const chunks: Buffer[] = [];
  req.on("data", (c: Buffer) => chunks.push(c));
  req.on("end", () => {
    let status = 200;
    let body: unknown;
    try {
      const out = runCalc((req.url ?? "/").slice(1), JSON.parse(Buffer.concat(chunks).toString("utf8")));
      if (out.ok) body = out.result;
      else [status, body] = [400, { fields: out.fields }];
    } catch {
      [status, body] = [400, { error: "The request body must be JSON" }];
    }
    res.writeHead(status, { "content-type": "application/json" });
    res.end(JSON.stringify(body));
  });
});
server.listen(port, "127.0.0.1", () => console.log(`bare calc server on ${port}`));
process.on("SIGTERM", () => server.close(() => process.exit(0)));
