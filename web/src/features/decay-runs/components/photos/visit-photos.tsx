import { useId, useState, type ChangeEvent } from 'react';
import { PHOTO_CAPTION_MAX_CHARS, PHOTO_MAX_BYTES, PHOTO_MAX_MEBIBYTES, PHOTO_MAX_MEGAPIXELS } from '../../../../../../shared/constants/photos';
import type { Photo } from '../../../../../../shared/schemas/photo';
import { buttonClass, Button } from '../../../../components/ui/button';
import { ErrorPanel } from '../../../../components/ui/error-panel';
import { inputClass } from '../../../../components/ui/field';
import { Modal } from '../../../../components/ui/modal';
import { ProgressBar } from '../../../../components/ui/progress-bar';
import { Spinner } from '../../../../components/ui/spinner';
import { ApiError } from '../../../../lib/api-client';
import { formatInstant } from '../../../../lib/dates';
import { useUploadVisitPhoto, useVisitPhotos } from '../../api/photos';
import { useOnline } from '../../drafts/draft-sync';

/**
 * The photos of a visit: thumbnails, each opening the full-size photo, and (when `canAdd`) a big
 * control that opens the phone's camera to add one. Photos are sent at once; offline, it says
 * plainly that a photo can be added when the connection is back (photos are not kept on the phone).
 */
export interface VisitPhotosProps {
  visitId: string;
  /** The bank the photos are of: only its photos are shown, and new photos are of it. Absent: every photo of the visit. */
  bankId?: string;
  /** The person may add photos (an assigned technician of the visit, or an admin). */
  canAdd: boolean;
}

/** What is being sent: the file, its id (kept for a retry, so a retry never makes a second photo) and the caption. */
interface Sending {
  file: File;
  clientId: string;
  caption: string;
}

export function VisitPhotos({ visitId, bankId, canAdd }: VisitPhotosProps) {
  const photos = useVisitPhotos(visitId);
  const online = useOnline();
  const [open, setOpen] = useState<Photo | null>(null);
  const shown = (photos.data?.items ?? []).filter((p) => !bankId || p.bankId === bankId);

  return (
    <section aria-label={bankId ? 'Photos of this bank' : 'Photos of this visit'} className="space-y-3" data-testid="visit-photos">
      {canAdd ? <AddPhoto visitId={visitId} bankId={bankId} online={online} /> : null}
      {photos.isPending ? (
        <Spinner label="Loading the photos…" />
      ) : photos.isError ? (
        online ? (
          <ErrorPanel title="The photos could not be loaded">{photos.error.message}</ErrorPanel>
        ) : (
          <p className="text-sm text-tide-800">The photos show when the connection is back.</p>
        )
      ) : shown.length === 0 ? (
        <p className="text-sm text-tide-800">No photos yet.</p>
      ) : (
        <ul className="grid grid-cols-3 gap-2 sm:grid-cols-4" aria-label="Photos">
          {shown.map((photo) => (
            <li key={photo.id}>
              <button
                type="button"
                onClick={() => setOpen(photo)}
                className="block aspect-square w-full overflow-hidden rounded-lg border border-tide-100 bg-tide-50 focus:outline-none focus:ring-2 focus:ring-spark-400"
                aria-label={`Open the photo${photo.caption ? ` “${photo.caption}”` : ''} taken ${formatInstant(photo.createdAt)} by ${photo.takenBy.name}`}
              >
                <img src={photo.thumbnailUrl} alt={photo.caption || 'Photo'} loading="lazy" className="h-full w-full object-cover" />
              </button>
            </li>
          ))}
        </ul>
      )}
      {open ? <PhotoViewer photo={open} onClose={() => setOpen(null)} /> : null}
    </section>
  );
}

function PhotoViewer({ photo, onClose }: { photo: Photo; onClose: () => void }) {
  return (
    <Modal title={photo.caption || 'Photo'} onClose={onClose} wide>
      <img
        src={photo.url}
        alt={photo.caption || 'Photo, full size'}
        width={photo.widthPx}
        height={photo.heightPx}
        className="mx-auto h-auto max-h-[70dvh] w-auto max-w-full rounded-lg"
      />
      <p className="mt-3 text-sm text-tide-800">
        Taken {formatInstant(photo.createdAt)} by {photo.takenBy.name} · {photo.widthPx} × {photo.heightPx} px
      </p>
      <a href={photo.url} target="_blank" rel="noreferrer" className={`${buttonClass('secondary')} mt-3`}>
        Open full size in a new tab
      </a>
    </Modal>
  );
}

/** A fresh id for a photo; the Web Crypto call where the page has it (https or this machine). */
export function newClientId(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6]! & 0x0f) | 0x40;
  b[8] = (b[8]! & 0x3f) | 0x80;
  const h = [...b].map((x) => x.toString(16).padStart(2, '0')).join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/**
 * Why a chosen file is not sent, checked in the browser before any byte goes (the server checks
 * the same and more); null when it may be sent.
 */
export function photoProblemBeforeSending(file: { name: string; type: string; size: number }, online: boolean): string | null {
  if (!online) return 'You are offline: this photo was not added. Take it again when the connection is back.';
  if (file.type && !file.type.startsWith('image/')) return `${file.name} is not a photo. Choose a JPEG, PNG, WebP or HEIF photo.`;
  if (file.size > PHOTO_MAX_BYTES) return `This photo is larger than ${PHOTO_MAX_MEBIBYTES} MB. Take it again at a lower resolution or quality.`;
  return null;
}

/** The refusal of a photo in plain words, with what to do. */
export function problemOf(error: unknown): string {
  if (error instanceof ApiError) {
    switch (error.code) {
      case 'file-too-large':
        return `This photo is larger than ${PHOTO_MAX_MEBIBYTES} MB. Take it again at a lower resolution or quality.`;
      case 'image-too-large':
        return `This photo has more than ${PHOTO_MAX_MEGAPIXELS} megapixels. Take it again at a lower resolution.`;
      case 'not-an-image':
        return 'This file is not a photo Ebbline can read. Choose a JPEG, PNG, WebP or HEIF photo.';
      case 'network':
        return 'The connection dropped: the photo was not added. Try again when the connection is back.';
      default:
        return error.message;
    }
  }
  return error instanceof Error ? error.message : 'The photo could not be added.';
}

function AddPhoto({ visitId, bankId, online }: { visitId: string; bankId?: string; online: boolean }) {
  const upload = useUploadVisitPhoto(visitId);
  const captionId = useId();
  const [caption, setCaption] = useState('');
  const [progress, setProgress] = useState(0);
  const [sending, setSending] = useState<Sending | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [added, setAdded] = useState(false);

  const send = (next: Sending) => {
    setSending(next);
    setProblem(null);
    setAdded(false);
    setProgress(0);
    upload.mutate(
      { file: next.file, clientId: next.clientId, bankId, caption: next.caption || undefined, onProgress: setProgress },
      {
        onSuccess: () => {
          setSending(null);
          setCaption('');
          setAdded(true);
        },
        onError: (error) => setProblem(problemOf(error)),
      },
    );
  };

  const choose = (event: ChangeEvent<HTMLInputElement>) => {
    const file = event.target.files?.[0];
    // the same photo can be chosen again after a refusal
    event.target.value = '';
    if (!file) return;
    setAdded(false);
    setSending(null);
    const refused = photoProblemBeforeSending(file, navigator.onLine);
    if (refused) {
      setProblem(refused);
      return;
    }
    send({ file, clientId: newClientId(), caption: caption.trim() });
  };

  const busy = upload.isPending;
  return (
    <div className="space-y-3">
      {!online ? (
        <p role="status" className="rounded-lg border border-spark-400/60 bg-spark-300/25 px-4 py-3 text-base text-tide-950">
          You are offline. Photos can be added when the connection is back; they are not kept on this phone.
        </p>
      ) : null}
      <div>
        <label htmlFor={captionId} className="mb-1 block text-sm font-medium text-tide-900">
          What the next photo shows <span className="font-normal text-tide-600">(optional)</span>
        </label>
        <input
          id={captionId}
          type="text"
          value={caption}
          maxLength={PHOTO_CAPTION_MAX_CHARS}
          onChange={(e) => setCaption(e.target.value)}
          placeholder="e.g. bulged can, left row"
          className={inputClass}
          disabled={busy}
        />
      </div>
      <label
        className={`${buttonClass('primary')} min-h-12 w-full cursor-pointer text-base focus-within:ring-2 focus-within:ring-spark-400 sm:w-auto ${busy || !online ? 'pointer-events-none opacity-60' : ''}`}
      >
        <CameraIcon /> Add a photo
        <input
          type="file"
          accept="image/*"
          capture="environment"
          className="sr-only"
          onChange={choose}
          disabled={busy || !online}
        />
      </label>
      <p className="text-xs text-tide-600">
        Up to {PHOTO_MAX_MEBIBYTES} MB and {PHOTO_MAX_MEGAPIXELS} megapixels. The position and camera details are removed before it is kept.
      </p>
      {busy ? <ProgressBar fraction={progress} label="Sending the photo" /> : null}
      {added ? (
        <p role="status" className="text-sm font-medium text-ok-600">
          ✓ Photo added.
        </p>
      ) : null}
      {problem ? (
        <div role="alert" className="space-y-2 rounded-lg border border-eol-600/30 bg-white px-4 py-3">
          <p className="text-base font-medium text-eol-600">{problem}</p>
          {sending && upload.error instanceof ApiError && (upload.error.status === 0 || upload.error.status >= 500) ? (
            <Button variant="secondary" onClick={() => send(sending)} disabled={!online}>
              Try again
            </Button>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}

function CameraIcon() {
  return (
    <svg aria-hidden="true" viewBox="0 0 24 24" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round">
      <path d="M4 8h3l2-3h6l2 3h3a1 1 0 0 1 1 1v10a1 1 0 0 1-1 1H4a1 1 0 0 1-1-1V9a1 1 0 0 1 1-1z" />
      <circle cx="12" cy="13.5" r="3.5" />
    </svg>
  );
}
