import { useEffect, useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { errorText } from '../../../components/ui/error-notice';
import { PHOTO_MAX_BYTES, PHOTO_TYPES, type PhotoView } from '../../../../shared/api/work-orders';
import { useUploadPhoto } from '../api/work-order-mutations';
import { rawFetch } from '../lib/raw-fetch';

/** Photos are served only with a token, so they are fetched and shown from a local object URL. */
function SignedInImage({ photo }: { photo: PhotoView }) {
  const [src, setSrc] = useState<string | null>(null);
  const [failed, setFailed] = useState(false);
  useEffect(() => {
    let url: string | null = null;
    let live = true;
    rawFetch(photo.url)
      .then((r) => r.blob())
      .then((b) => {
        url = URL.createObjectURL(b);
        if (live) setSrc(url);
      })
      .catch(() => live && setFailed(true));
    return () => {
      live = false;
      if (url) URL.revokeObjectURL(url);
    };
  }, [photo.url]);
  if (failed) return <span className="text-danger">Could not load {photo.originalName}</span>;
  return src ? <img src={src} alt={photo.originalName} className="h-32 w-32 rounded-md border border-line bg-canvas object-contain" /> : <span className="text-muted">Loading…</span>;
}

export function PhotoPanel({ orderId, photos, canUpload }: { orderId: number; photos: PhotoView[]; canUpload: boolean }) {
  const upload = useUploadPhoto(orderId);
  const [error, setError] = useState<string | null>(null);

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const file = (form.elements.namedItem('photo') as HTMLInputElement).files?.[0];
    if (!file) return setError('Choose a photo first.');
    if (file.size > PHOTO_MAX_BYTES) return setError(`A photo may be at most ${PHOTO_MAX_BYTES / (1024 * 1024)} MB.`);
    setError(null);
    upload.mutate(file, { onSuccess: () => form.reset(), onError: (err) => setError(errorText(err)) });
  }

  return (
    <div className="flex flex-col gap-4">
      {photos.length ? (
        <ul className="flex flex-wrap gap-4" aria-label="Photos">
          {photos.map((p) => (
            <li key={p.id} className="flex flex-col gap-1 text-sm">
              <SignedInImage photo={p} />
              <span className="max-w-32 truncate" title={p.originalName}>{p.originalName}</span>
              <span className="text-muted">{p.uploadedBy}</span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-muted">No photos yet.</p>
      )}
      {canUpload && (
        <form onSubmit={submit} className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col gap-1 text-sm font-medium text-muted">
            Photo (JPEG, PNG or WebP, at most 8 MB)
            <input type="file" name="photo" accept={PHOTO_TYPES.join(',')} className="text-fg" />
          </label>
          <Button type="submit" disabled={upload.isPending}>{upload.isPending ? 'Uploading…' : 'Upload photo'}</Button>
          {error && <p role="alert" className="font-medium text-danger">{error}</p>}
        </form>
      )}
    </div>
  );
}
