import { useCallback, useRef, useState } from 'react';
import { binaryMark, netcdfKind } from '../../../../shared/seadata';

/** Bytes read in the browser for format detection and the preview. */
export const HEAD_BYTES = 64 * 1024;

/** What the browser read from the start of a chosen file. */
export interface FileHead {
  file: File | null;
  /** The leading text (whole lines only) of a text file; null for NetCDF, binary or unread. */
  text: string | null;
  /** NetCDF kind known from the first bytes, else null. */
  netcdf: 'netcdf4' | 'classic' | null;
  /** Why the file cannot be imported as read (binary that is not NetCDF, unreadable). */
  error: string | null;
}

const EMPTY: FileHead = { file: null, text: null, netcdf: null, error: null };

/**
 * Reads the head of the chosen file for the import form: NetCDF by its signature, otherwise the
 * first 64 kB as text (cut to whole lines) checked for binary content. A later choice wins over a
 * read still running. `skipTextOver` bytes: larger text files are not read (over the limit).
 */
export function useFileHead(skipTextOver: number) {
  const [head, setHead] = useState<FileHead>(EMPTY);
  const token = useRef(0);

  const choose = useCallback(
    async (f: File | null): Promise<FileHead> => {
      const mine = ++token.current;
      const set = (h: FileHead) => {
        if (mine === token.current) setHead(h);
        return h;
      };
      set({ ...EMPTY, file: f });
      if (!f) return EMPTY;
      try {
        const first = new Uint8Array(await f.slice(0, 8).arrayBuffer());
        const kind = netcdfKind(first);
        if (kind) return set({ file: f, text: null, netcdf: kind, error: null });
        if (f.size > skipTextOver) return set({ file: f, text: null, netcdf: null, error: null });
        let text = await f.slice(0, HEAD_BYTES).text();
        if (f.size > HEAD_BYTES) {
          // Keep whole lines only: the last one may be cut (even inside a character).
          const nl = text.lastIndexOf('\n');
          if (nl > 0) text = text.slice(0, nl + 1);
        }
        if (binaryMark(text) !== null) {
          return set({
            file: f,
            text: null,
            netcdf: null,
            error: 'This is not a text file: it holds binary data. Choose a CSV or NDBC text file, or a NetCDF file.',
          });
        }
        return set({ file: f, text, netcdf: null, error: null });
      } catch {
        return set({ file: f, text: null, netcdf: null, error: 'The browser could not read this file.' });
      }
    },
    [skipTextOver],
  );

  return { head, choose };
}
