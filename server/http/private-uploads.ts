// Where uploads wait while they are imported: a folder only this server's user can enter (0700),
// files only it can read (0600), under random names. On a shared machine the system's temporary
// folder is readable by everyone; uploads hold a client's data.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';
import type { Request } from 'express';
import type multer from 'multer';

/**
 * Makes `dir` (0700) or checks an existing one: a real folder (not a link), owned by this process's
 * user, with no access for group or others (tightened if it was looser). Throws when another user
 * owns it, which would let them read every upload.
 */
export function ensurePrivateDir(dir: string): void {
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  const st = fs.lstatSync(dir);
  if (!st.isDirectory() || st.isSymbolicLink()) throw new Error(`Upload folder ${dir} is not a plain folder`);
  if (typeof process.getuid === 'function' && st.uid !== process.getuid()) {
    throw new Error(`Upload folder ${dir} belongs to another user (uid ${st.uid}): remove it or set TMPDIR to a private folder`);
  }
  if ((st.mode & 0o077) !== 0) fs.chmodSync(dir, 0o700);
}

/** multer storage: each file written as `dir/<32 hex>` with mode 0600, created exclusively. */
export function privateDiskStorage(dir: string): multer.StorageEngine {
  return {
    _handleFile(_req: Request, file, cb) {
      const name = crypto.randomBytes(16).toString('hex');
      const target = path.join(dir, name);
      const out = fs.createWriteStream(target, { flags: 'wx', mode: 0o600 });
      let size = 0;
      file.stream.on('data', (chunk: Buffer) => (size += chunk.length));
      pipeline(file.stream, out).then(
        () => cb(null, { destination: dir, filename: name, path: target, size }),
        (err: unknown) => {
          fs.rm(target, { force: true }, () => cb(err as Error));
        },
      );
    },
    _removeFile(_req: Request, file, cb) {
      fs.rm(file.path, { force: true }, (err) => cb(err));
    },
  };
}
