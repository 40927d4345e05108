// Where uploads wait while they are imported: a folder only this server's user can enter (0700),
// files only it can read (0600), under random names. On a shared machine the system's temporary
// folder is readable by everyone; uploads hold a client's data.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
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

/** The size limit an upload ran into (set by {@link privateDiskStorage} before multer's error). */
export const uploadLimitHit = new WeakMap<Request, number>();

/**
 * multer storage: each file written as `dir/<32 hex>` with mode 0600, created exclusively.
 * `limitFor(firstBytes)` may give a smaller limit than multer's `fileSize` from the file's first
 * bytes (a text upload's limit below a NetCDF file's): over it, multer's own size error is raised
 * (413) and the rest of the part is read and dropped.
 */
export function privateDiskStorage(dir: string, limitFor?: (firstBytes: Buffer) => number): multer.StorageEngine {
  return {
    _handleFile(req: Request, file, cb) {
      const name = crypto.randomBytes(16).toString('hex');
      const target = path.join(dir, name);
      const out = fs.createWriteStream(target, { flags: 'wx', mode: 0o600 });
      let size = 0;
      let limit = Infinity;
      let first = true;
      let over = false;
      const onData = (chunk: Buffer) => {
        if (first && limitFor) limit = limitFor(chunk);
        first = false;
        size += chunk.length;
        if (size <= limit || over) return;
        over = true;
        uploadLimitHit.set(req, limit);
        file.stream.unpipe(out);
        out.destroy();
        file.stream.off('data', onData);
        // The rest of the part is read and dropped; multer answers once it has ended.
        file.stream.once('end', () => fs.rm(target, { force: true }, () => cb(new Error('upload over its size limit'))));
        file.stream.resume();
        file.stream.emit('limit');
      };
      file.stream.on('data', onData);
      // Not stream.pipeline: it would destroy the upload stream when the file is dropped, and
      // multer waits for that part to end.
      let settled = false;
      const fail = (err: unknown) => {
        if (over || settled) return; // a dropped file is answered when its rest has been read
        settled = true;
        file.stream.unpipe(out);
        out.destroy();
        fs.rm(target, { force: true }, () => cb(err as Error));
      };
      out.on('error', fail);
      file.stream.on('error', fail);
      out.on('finish', () => {
        if (over || settled) return;
        settled = true;
        cb(null, { destination: dir, filename: name, path: target, size });
      });
      file.stream.pipe(out);
    },
    _removeFile(_req: Request, file, cb) {
      fs.rm(file.path, { force: true }, (err) => cb(err));
    },
  };
}
