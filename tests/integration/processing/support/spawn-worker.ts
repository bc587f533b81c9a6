// The worker as its own process (worker/main.ts), with this test slot's environment. Started in its
// own process group so that a SIGKILL can take the worker and its ffmpeg children down together, as
// a crash or an OOM kill of the whole container would.
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { TEST_ENV } from "@/tests/support/test-env";

const root = path.resolve(__dirname, "../../../..");

export interface WorkerProcess {
  child: ChildProcess;
  output: () => string;
  waitForLine: (pattern: RegExp, timeoutMs?: number) => Promise<void>;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  /** SIGKILL to the whole process group (worker + ffmpeg). */
  killHard: () => void;
}

export function spawnWorker(extraEnv: Record<string, string> = {}): WorkerProcess {
  // `node --import tsx`, not the tsx CLI: the CLI runs the program in a child process, so killing
  // the CLI's pid would not kill the worker.
  const child = spawn(process.execPath, ["--import", "tsx", "worker/main.ts"], {
    cwd: root,
    env: { ...process.env, ...TEST_ENV, ...extraEnv },
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  let out = "";
  const listeners = new Set<() => void>();
  const onData = (chunk: Buffer) => {
    out += chunk.toString("utf8");
    for (const l of listeners) l();
  };
  child.stdout!.on("data", onData);
  child.stderr!.on("data", onData);
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.on("exit", (code, signal) => resolve({ code, signal })),
  );
  return {
    child,
    output: () => out,
    exited,
    killHard: () => {
      try {
        process.kill(-child.pid!, "SIGKILL");
      } catch {
        // already gone
      }
    },
    waitForLine: (pattern, timeoutMs = 60_000) =>
      new Promise<void>((resolve, reject) => {
        const check = () => {
          if (pattern.test(out)) {
            listeners.delete(check);
            clearTimeout(timer);
            resolve();
          }
        };
        const timer = setTimeout(() => {
          listeners.delete(check);
          reject(new Error(`worker did not print ${pattern} within ${timeoutMs} ms; output:\n${out}`));
        }, timeoutMs);
        listeners.add(check);
        check();
      }),
  };
}
