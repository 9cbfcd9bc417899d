/**
 * First-load JavaScript per route, gzipped (zlib default level), two ways:
 *
 * 1. From the build (`.next`): the App Router's shared entry files
 *    (`build-manifest.json` rootMainFiles; the nomodule polyfills are left out, a
 *    modern browser skips them) plus every chunk the route's segments name in its
 *    client reference manifest (`server/app/<route>/page_client-reference-manifest.js`,
 *    `entryJSFiles`: root layout, group layouts, error/loading/not-found boundaries
 *    and the page). Each file counted once. This is what the HTML references.
 * 2. In the browser, against `next start`: every script response of a fresh page
 *    (HTTP cache off), signed in as the role that may open the route, gzipped the same
 *    way, counted until `load`, and again once the network is idle (chunks a page
 *    imports on demand after hydration, such as the sheet editor's form module; a web
 *    worker's own script is not a page response and is not counted).
 *
 * Goals (on method 1): sheet editor ≤ 250 kB, other routes ≤ 150 kB.
 */
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import vm from "node:vm";
import { gzipSync } from "node:zlib";
import type { BrowserContext } from "playwright-core";
import { prepareBenchActors, type BenchActors, type BenchUser } from "./support/actors";
import { launchBrowser, signIn, type BenchBrowser } from "./support/browser";
import { missingBuild, startNextServer, type RunningServer } from "./support/server";
import { ensureBenchSheets } from "./support/sheets";
import { loadLine, table } from "./support/stats";

const NEXT_DIR = path.join(process.cwd(), ".next");
const KB = 1000;

type Who = "engineer" | "lead" | "admin" | "none";
interface RouteSpec {
  route: string;
  label: string;
  goalKb: number;
  who: Who;
  /** The URL to open in the browser, from the bench project and sheet ids. */
  url: (ids: { projectId: number; sheetId: number }) => string;
}

const ROUTES: RouteSpec[] = [
  { route: "/login", label: "/login", goalKb: 150, who: "none", url: () => "/login" },
  { route: "/projects", label: "/projects", goalKb: 150, who: "engineer", url: () => "/projects" },
  { route: "/projects/[id]", label: "/projects/[id]", goalKb: 150, who: "engineer", url: (i) => `/projects/${i.projectId}` },
  { route: "/projects/[id]/sheets/[sheetId]", label: "/projects/[id]/sheets/[sheetId] (editor)", goalKb: 250, who: "engineer", url: (i) => `/projects/${i.projectId}/sheets/${i.sheetId}` },
  { route: "/projects/[id]/sheets/new", label: "/projects/[id]/sheets/new", goalKb: 150, who: "engineer", url: (i) => `/projects/${i.projectId}/sheets/new` },
  { route: "/review", label: "/review", goalKb: 150, who: "lead", url: () => "/review" },
  { route: "/my-sheets", label: "/my-sheets", goalKb: 150, who: "engineer", url: () => "/my-sheets" },
  { route: "/admin/users", label: "/admin/users", goalKb: 150, who: "admin", url: () => "/admin/users" },
];

const gzipCache = new Map<string, { raw: number; gz: number }>();
function fileSize(rel: string) {
  let s = gzipCache.get(rel);
  if (!s) {
    const buf = readFileSync(path.join(NEXT_DIR, rel));
    s = { raw: buf.length, gz: gzipSync(buf).length };
    gzipCache.set(rel, s);
  }
  return s;
}

function sum(files: Iterable<string>) {
  let raw = 0;
  let gz = 0;
  for (const f of files) {
    const s = fileSize(f);
    raw += s.raw;
    gz += s.gz;
  }
  return { raw, gz };
}

/** "/(app)/projects/[id]/page" → "/projects/[id]". */
function urlOfAppPath(key: string): string | null {
  if (!key.endsWith("/page")) return null;
  const segs = key
    .slice(0, -"/page".length)
    .split("/")
    .filter((s) => s && !/^\(.*\)$/.test(s));
  return "/" + segs.join("/");
}

interface ManifestFigures {
  shared: { raw: number; gz: number; files: number };
  routes: Map<string, { raw: number; gz: number; files: number }>;
}

export function fromManifests(): ManifestFigures {
  const build = JSON.parse(readFileSync(path.join(NEXT_DIR, "build-manifest.json"), "utf8")) as { rootMainFiles: string[] };
  const appPaths = JSON.parse(readFileSync(path.join(NEXT_DIR, "server", "app-paths-manifest.json"), "utf8")) as Record<string, string>;
  const shared = new Set(build.rootMainFiles);
  const routes = new Map<string, { raw: number; gz: number; files: number }>();
  for (const [key, file] of Object.entries(appPaths)) {
    const url = urlOfAppPath(key);
    if (!url || !ROUTES.some((r) => r.route === url)) continue;
    const manifestFile = path.join(NEXT_DIR, "server", file.replace(/\.js$/, "_client-reference-manifest.js"));
    if (!existsSync(manifestFile)) throw new Error(`first-load: ${path.relative(process.cwd(), manifestFile)} is missing`);
    const sandbox: { __RSC_MANIFEST?: Record<string, { entryJSFiles?: Record<string, string[]> }> } = {};
    vm.runInNewContext(readFileSync(manifestFile, "utf8"), sandbox);
    const m = sandbox.__RSC_MANIFEST?.[key];
    if (!m?.entryJSFiles) throw new Error(`first-load: no entryJSFiles for ${key}`);
    const files = new Set(shared);
    for (const list of Object.values(m.entryJSFiles)) for (const f of list) files.add(f);
    routes.set(url, { ...sum(files), files: files.size });
  }
  return { shared: { ...sum(shared), files: shared.size }, routes };
}

interface BrowserFigure {
  atLoad: number;
  atIdle: number;
  files: number;
  status: number;
  finalPath: string;
}

async function inBrowser(ctx: BrowserContext, url: string): Promise<BrowserFigure> {
  const page = await ctx.newPage();
  try {
    const cdp = await ctx.newCDPSession(page);
    await cdp.send("Network.setCacheDisabled", { cacheDisabled: true });
    let loaded = false;
    let atLoad = 0;
    let atIdle = 0;
    let files = 0;
    const pending: Promise<void>[] = [];
    page.on("response", (res) => {
      if (res.request().resourceType() !== "script") return;
      const before = !loaded;
      pending.push(
        res.body().then(
          (b) => {
            const gz = gzipSync(b).length;
            files++;
            atIdle += gz;
            if (before) atLoad += gz;
          },
          () => undefined,
        ),
      );
    });
    page.once("load", () => {
      loaded = true;
    });
    const res = await page.goto(url, { waitUntil: "load" });
    await page.waitForLoadState("networkidle", { timeout: 30_000 }).catch(() => undefined);
    await Promise.all(pending);
    return { atLoad, atIdle, files, status: res?.status() ?? 0, finalPath: new URL(page.url()).pathname };
  } finally {
    await page.close();
  }
}

async function browserFigures(actors: BenchActors, server: RunningServer, browser: BenchBrowser): Promise<Map<string, BrowserFigure | string>> {
  const { projectId, sheets } = await ensureBenchSheets(server.baseURL, actors.token, actors.engineer.id, ["busbar-rating"]);
  const ids = { projectId, sheetId: sheets["busbar-rating"]! };
  const contexts = new Map<Who, BrowserContext>();
  const contextFor = async (who: Who) => {
    let ctx = contexts.get(who);
    if (!ctx) {
      ctx = await browser.newContext();
      if (who !== "none") {
        const user: BenchUser = actors[who];
        const page = await ctx.newPage();
        await signIn(page, user.email, user.password);
        await page.close();
      }
      contexts.set(who, ctx);
    }
    return ctx;
  };
  const out = new Map<string, BrowserFigure | string>();
  for (const r of ROUTES) {
    try {
      out.set(r.route, await inBrowser(await contextFor(r.who), r.url(ids)));
    } catch (err) {
      out.set(r.route, `failed: ${err instanceof Error ? err.message.split("\n")[0] : String(err)}`);
    }
  }
  return out;
}

const kb = (bytes: number) => `${(bytes / KB).toFixed(1)} kB`;

export async function run(): Promise<void> {
  const missing = missingBuild();
  if (missing) {
    console.log(missing);
    return;
  }
  console.log(`build ${readFileSync(path.join(NEXT_DIR, "BUILD_ID"), "utf8").trim()}; ${loadLine()}`);
  const m = fromManifests();
  console.log(`shared by every route (rootMainFiles): ${m.shared.files} files, ${kb(m.shared.raw)} raw, ${kb(m.shared.gz)} gzip`);

  let fromBrowser = new Map<string, BrowserFigure | string>();
  const actors = await prepareBenchActors();
  let server: RunningServer | undefined;
  let browser: BenchBrowser | undefined;
  try {
    server = await startNextServer();
    browser = await launchBrowser(server.baseURL);
    fromBrowser = await browserFigures(actors, server, browser);
  } catch (err) {
    console.log(`browser measurement skipped: ${err instanceof Error ? err.message : String(err)}`);
  } finally {
    await browser?.close();
    await server?.stop();
  }

  const rows = [["route", "files", "raw", "gzip (build)", "goal", "", "browser @load", "@idle", "as"]];
  for (const r of ROUTES) {
    const f = m.routes.get(r.route);
    const b = fromBrowser.get(r.route);
    const browserCols =
      b === undefined ? ["—", "—", "—"] : typeof b === "string" ? [b, "", r.who] : [kb(b.atLoad), kb(b.atIdle), `${r.who}${b.finalPath.startsWith("/login") && r.who !== "none" ? " (redirected to /login)" : ""}${b.status >= 400 ? ` (${b.status})` : ""}`];
    if (!f) rows.push([r.label, "—", "—", "not in the build", `≤ ${r.goalKb} kB`, "", ...browserCols]);
    else rows.push([r.label, String(f.files), kb(f.raw), kb(f.gz), `≤ ${r.goalKb} kB`, f.gz <= r.goalKb * KB ? "met" : "OVER", ...browserCols]);
  }
  console.log(table(rows));
  console.log("kB = 1000 bytes. build: rootMainFiles + the route's entryJSFiles from its client reference manifest; browser: script responses of a cold page.");
}
