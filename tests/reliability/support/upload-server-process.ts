// The upload server (tests/support/run-upload-server.ts: the very route module Next serves at
// /api/uploads) as a process of its own, with the suite's environment, so a test can SIGKILL it.
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";

const root = path.resolve(__dirname, "../../..");

export type ServerProcess = { child: ChildProcess; output: () => string };

export async function startUploadServerProcess(port: number, env: Record<string, string> = {}): Promise<ServerProcess> {
  // node itself with tsx's loader: one process, so SIGKILL kills the server and not a wrapper
  const child = spawn(process.execPath, ["--import", "tsx", "tests/support/run-upload-server.ts"], {
    cwd: root,
    env: { ...process.env, ...env, UPLOAD_SERVER_PORT: String(port) },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  child.stderr!.on("data", (d: Buffer) => (out += d.toString()));
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`upload server did not start:\n${out}`)), 60_000);
    child.stdout!.on("data", (d: Buffer) => {
      out += d.toString();
      if (out.includes("listening")) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.once("exit", (code, signal) => {
      clearTimeout(timer);
      reject(new Error(`upload server exited (${code ?? signal}):\n${out}`));
    });
  });
  // a server that dies on its own (not killed by a test) says why, so a failure that follows can be read
  child.once("exit", (code, signal) => {
    if (signal !== "SIGKILL" && signal !== "SIGTERM") console.error(`[upload server exited by itself (${code ?? signal})]\n${out.slice(-6000)}`);
  });
  return { child, output: () => out };
}
