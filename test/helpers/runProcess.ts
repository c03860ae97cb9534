// Runs a child process to its end and returns its exit code and output, also when it fails
// (the tests that run the real command under plain Node).
import { execFile } from "node:child_process";
import { promisify } from "node:util";

const exec = promisify(execFile);

/** What a finished child process gave. */
export interface ProcessResult {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs `node ...args` in `cwd` with `env` added to this process's environment (NO_COLOR=1 by default). */
export async function runNode(args: string[], cwd: string, env: Record<string, string> = { NO_COLOR: "1" }): Promise<ProcessResult> {
  try {
    const { stdout, stderr } = await exec(process.execPath, args, { cwd, env: { ...process.env, ...env }, maxBuffer: 1 << 26 });
    return { code: 0, stdout, stderr };
  } catch (err) {
    const e = err as { code: number; stdout: string; stderr: string };
    return { code: e.code, stdout: e.stdout, stderr: e.stderr };
  }
}
