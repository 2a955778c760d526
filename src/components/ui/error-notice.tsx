import { ApiError } from '../../lib/api-error';

/** Words for an error a person can act on; the server's own message where it gave one. */
export function errorText(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.status === 403) return 'Your role is not allowed to do this.';
    return error.message;
  }
  if (error instanceof Error) return error.message;
  return 'Something went wrong.';
}

export function ErrorNotice({ error, title }: { error: unknown; title?: string }) {
  if (!error) return null;
  return (
    <div role="alert" className="rounded-md border border-danger/50 bg-danger/10 px-4 py-3 text-danger">
      {title && <p className="font-semibold">{title}</p>}
      <p>{errorText(error)}</p>
    </div>
  );
}
