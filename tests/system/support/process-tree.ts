// kill -9 of a whole process tree: a test that kills a process must kill whatever it started too
// (a CLI wrapper such as tsx's runs the script in a child that a SIGKILL to the wrapper misses).
import { readdir, readFile } from "node:fs/promises";
import { isAlive } from "./private-db";

/** Parent of every process, read from /proc/<pid>/stat (the kernel here has no /proc/…/children). */
async function parents(): Promise<Map<number, number[]>> {
  const byParent = new Map<number, number[]>();
  for (const name of await readdir("/proc")) {
    if (!/^\d+$/.test(name)) continue;
    const stat = await readFile(`/proc/${name}/stat`, "utf8").catch(() => "");
    const rest = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    const ppid = Number(rest[1]);
    if (!Number.isInteger(ppid)) continue;
    const list = byParent.get(ppid) ?? [];
    list.push(Number(name));
    byParent.set(ppid, list);
  }
  return byParent;
}

export async function processTree(pid: number): Promise<number[]> {
  const byParent = await parents();
  const out: number[] = [];
  const walk = (p: number) => {
    out.push(p);
    for (const c of byParent.get(p) ?? []) walk(c);
  };
  walk(pid);
  return out;
}

/**
 * SIGKILL to these processes at once (no await before the signals, so the moment is the
 * caller's), children first; resolves once all are dead. Find them beforehand with processTree.
 */
export async function killAll(pids: readonly number[]): Promise<void> {
  for (const p of [...pids].reverse()) {
    try {
      process.kill(p, "SIGKILL");
    } catch {
      // already gone
    }
  }
  const until = Date.now() + 10_000;
  for (const p of pids) {
    while (await isAlive(p)) {
      if (Date.now() > until) throw new Error(`process ${p} still alive 10 s after SIGKILL`);
      await new Promise((r) => setTimeout(r, 10));
    }
  }
}

/** kill -9 of a process and everything it started. */
export async function killTree(pid: number): Promise<number[]> {
  const tree = await processTree(pid);
  await killAll(tree);
  return tree;
}
