import type { UploadProgress } from '../api/import-dataset';
import { formatBytes, formatCount } from './format';

function Bar({ label, share, detail }: { label: string; share: number | null; detail: string }) {
  const pct = share === null ? null : Math.max(0, Math.min(100, Math.round(share * 100)));
  return (
    <div>
      <div className="mb-1 flex flex-wrap justify-between gap-2 text-sm">
        <span className="font-semibold">{label}</span>
        <span className="text-ink-soft tabular-nums">{detail}</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct ?? undefined}
        className="h-3 overflow-hidden rounded-full bg-surface-2"
      >
        <div
          className={`h-full rounded-full bg-accent transition-[width] ${pct === null ? 'w-1/3 animate-pulse' : ''}`}
          style={pct === null ? undefined : { width: `${pct}%` }}
        />
      </div>
    </div>
  );
}

/**
 * Two steps of an upload: the bytes sent by the browser, then the rows the server reads (it
 * reports every few megabytes) and the saving of the records.
 */
export function UploadProgressView({ progress, fileSize }: { progress: UploadProgress | null; fileSize: number }) {
  const sending = progress?.phase === 'sending' ? progress : null;
  const sentShare = progress === null ? 0 : sending ? sending.sentBytes / Math.max(1, sending.totalBytes) : 1;
  const sentDetail = sending
    ? `${formatBytes(Math.min(sending.sentBytes, fileSize))} of ${formatBytes(fileSize)}, ${Math.round(sentShare * 100)} %`
    : progress === null
      ? 'starting'
      : `${formatBytes(fileSize)}, done`;

  let readLabel = 'Reading rows on the server';
  let readShare: number | null = 0;
  let readDetail = 'waiting for the file';
  if (progress?.phase === 'sending' && sentShare >= 1) {
    readShare = null;
    readDetail = 'started';
  } else if (progress?.phase === 'parsing') {
    readShare = progress.bytesRead / Math.max(1, progress.totalBytes);
    readDetail = `${formatCount(progress.rows)} rows, ${Math.round(readShare * 100)} % of the file`;
  } else if (progress?.phase === 'saving') {
    readLabel = 'Saving the records';
    readShare = null;
    readDetail = `${formatCount(progress.rows)} rows read`;
  }
  return (
    <div className="flex flex-col gap-3" data-testid="upload-progress" aria-live="polite">
      <Bar label="Sending the file" share={sentShare} detail={sentDetail} />
      <Bar label={readLabel} share={readShare} detail={readDetail} />
    </div>
  );
}
