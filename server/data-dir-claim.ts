// One process per embedded data folder. A server claims DATA_DIR by writing DATA_DIR/server.json
// (exclusive create, mode 600) BEFORE it opens the database, with its pid and, once it listens,
// its port and the token for internal routes. `npm run plan:once`, `db:backup` and `db:restore`
// read it: a live pid means "a server holds this folder" even while it is still migrating or
// seeding; a file left by a killed process (pid not alive) is ignored and replaced.
import fs from 'node:fs';
import path from 'node:path';

export interface ServerClaim {
  pid: number;
  /** null while the server is starting (migrations, seed), before it listens. */
  port: number | null;
  jobToken: string;
}

export const claimFile = (dataDir: string) => path.join(path.resolve(dataDir), 'server.json');

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: the process exists but belongs to another user.
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** The live server holding DATA_DIR, or null (no file, an unreadable one, or one left by a dead process). */
export function liveClaim(dataDir: string): ServerClaim | null {
  let info: ServerClaim;
  try {
    info = JSON.parse(fs.readFileSync(claimFile(dataDir), 'utf8')) as ServerClaim;
  } catch {
    return null;
  }
  return Number.isInteger(info.pid) && info.pid !== process.pid && alive(info.pid) ? info : null;
}

/** Claims DATA_DIR for this process, or throws naming the live server that holds it. */
export function claimDataDir(dataDir: string, jobToken: string): void {
  fs.mkdirSync(path.resolve(dataDir), { recursive: true });
  const file = claimFile(dataDir);
  const body = JSON.stringify({ pid: process.pid, port: null, jobToken } satisfies ServerClaim);
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      fs.writeFileSync(file, body, { flag: 'wx', mode: 0o600 });
      return;
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
    }
    const holder = liveClaim(dataDir);
    if (holder) {
      throw new Error(
        `Another Lullwatch server (pid ${holder.pid}) is using ${path.resolve(dataDir)}; the embedded database may be opened by one process only. ` +
          'Stop it, or give this one another DATA_DIR.',
      );
    }
    fs.rmSync(file, { force: true }); // left by a process that is gone
  }
  throw new Error(`Could not claim ${path.resolve(dataDir)} (${file} keeps reappearing)`);
}

/** Adds the port once the server listens. */
export function publishPort(dataDir: string, port: number, jobToken: string): void {
  fs.writeFileSync(claimFile(dataDir), JSON.stringify({ pid: process.pid, port, jobToken } satisfies ServerClaim), { mode: 0o600 });
}

/** Gives DATA_DIR up (only if this process still holds it). */
export function releaseDataDir(dataDir: string): void {
  try {
    const info = JSON.parse(fs.readFileSync(claimFile(dataDir), 'utf8')) as ServerClaim;
    if (info.pid === process.pid) fs.rmSync(claimFile(dataDir), { force: true });
  } catch {
    /* already gone */
  }
}
