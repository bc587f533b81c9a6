// Browser tests: serve the built app (next start) and run the worker, both with the test
// environment, and stop both afterwards. `npm test` builds the app before this runs.
import { spawn, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, openSync } from "node:fs";
import path from "node:path";
import { TEST_ENV, E2E_PORT } from "./test-env";

const root = path.resolve(__dirname, "../..");
let web: ChildProcess | undefined;
let worker: ChildProcess | undefined;

async function waitFor(url: string, ms: number) {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    try {
      const r = await fetch(url);
      if (r.status < 500) return;
    } catch {}
    await new Promise((r) => setTimeout(r, 300));
  }
  throw new Error(`the app did not answer at ${url}`);
}

export default async function setup() {
  if (!existsSync(path.join(root, TEST_ENV.NEXT_DIST_DIR, "BUILD_ID"))) throw new Error(`build the app first: NEXT_DIST_DIR=${TEST_ENV.NEXT_DIST_DIR} npx next build`);
  mkdirSync(path.join(root, ".data/logs"), { recursive: true });
  const env = { ...process.env, ...TEST_ENV, PORT: String(E2E_PORT) };
  const out = (name: string) => openSync(path.join(root, `.data/logs/e2e-${TEST_ENV.NEXT_DIST_DIR.replace(/^\./, "")}-${name}.log`), "w");
  web = spawn(path.join(root, "node_modules/.bin/next"), ["start", "-p", String(E2E_PORT), "-H", "127.0.0.1"], { cwd: root, env, stdio: ["ignore", out("web"), out("web-err")] });
  worker = spawn(path.join(root, "node_modules/.bin/tsx"), ["worker/main.ts"], { cwd: root, env, stdio: ["ignore", out("worker"), out("worker-err")] });
  await waitFor(`http://127.0.0.1:${E2E_PORT}/sign-in`, 60_000);
  return async () => {
    worker?.kill("SIGTERM");
    web?.kill("SIGTERM");
  };
}
