// Waits until a TCP port accepts connections or a URL answers below 500.
// Usage: node scripts/wait-for.mjs <tcp://host:port | http://host:port/path> [seconds=30]
// Exit code 0 when ready, 1 on timeout.
import net from "node:net";

const [target, secondsArg] = process.argv.slice(2);
if (!target) {
  console.error("usage: node scripts/wait-for.mjs <tcp://host:port | http://…> [seconds]");
  process.exit(2);
}
const deadline = Date.now() + Number(secondsArg ?? 30) * 1000;

function tcpOnce(host, port) {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port: Number(port) });
    const done = (ok) => {
      socket.destroy();
      resolve(ok);
    };
    socket.setTimeout(1000, () => done(false));
    socket.once("connect", () => done(true));
    socket.once("error", () => done(false));
  });
}

async function httpOnce(url) {
  try {
    const res = await fetch(url, { redirect: "manual", signal: AbortSignal.timeout(5000) });
    return res.status < 500;
  } catch {
    return false;
  }
}

const once = target.startsWith("tcp://")
  ? () => {
      const [host, port] = target.slice(6).split(":");
      return tcpOnce(host, port);
    }
  : () => httpOnce(target);

while (Date.now() < deadline) {
  if (await once()) {
    console.log(`ready: ${target}`);
    process.exit(0);
  }
  await new Promise((r) => setTimeout(r, 250));
}
console.error(`not ready after ${secondsArg ?? 30} s: ${target}`);
process.exit(1);
