import { spawn, type ChildProcess } from "node:child_process";

/**
 * A production server of the built app started by a spec itself (beside the one Playwright's webServer runs), for
 * tests that need their own database or several instances. Started in its own process group so it can be stopped
 * with everything it spawned.
 */
export class AppServer {
  private constructor(
    readonly url: string,
    private readonly child: ChildProcess,
    private readonly output: string[],
  ) {}

  static async start(port: number, env: Record<string, string>): Promise<AppServer> {
    const url = `http://localhost:${port}`;
    const child = spawn("npx", ["next", "start", "-p", String(port)], {
      env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1", NEXTAUTH_URL: url, ...env },
      detached: true,
      stdio: ["ignore", "pipe", "pipe"],
    });
    const output: string[] = [];
    child.stdout!.on("data", (d: Buffer) => output.push(d.toString()));
    child.stderr!.on("data", (d: Buffer) => output.push(d.toString()));
    const server = new AppServer(url, child, output);
    const deadline = Date.now() + 60_000;
    for (;;) {
      if (child.exitCode !== null) throw new Error(`The app on port ${port} exited early:\n${output.join("")}`);
      const ready = await fetch(`${url}/sign-in`).then((r) => r.ok, () => false);
      if (ready) return server;
      if (Date.now() > deadline) {
        server.stop();
        throw new Error(`The app on port ${port} did not start within 60 s:\n${output.join("")}`);
      }
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
  }

  log(): string {
    return this.output.join("");
  }

  stop(): void {
    try {
      process.kill(-this.child.pid!, "SIGTERM");
    } catch {
      // already gone
    }
  }
}
