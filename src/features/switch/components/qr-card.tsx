import type { SwitchSheetEntry } from '../types';

/** Only markup from our own server that is an <svg> document is put into the page. */
export function isSvgMarkup(s: string): boolean {
  return s.trimStart().startsWith('<svg');
}

/** A cut-out card for the isolator: the QR code of the unit's switch page, its id, name and depot. */
export function QrCard({ entry }: { entry: SwitchSheetEntry }) {
  return (
    <article className="qr-card flex flex-col items-center gap-2 rounded-lg border-2 border-dashed border-line bg-white p-4 text-center text-black">
      {isSvgMarkup(entry.qrSvg) ? (
        <div className="h-44 w-44 [&>svg]:h-full [&>svg]:w-full" role="img" aria-label={`QR code for ${entry.unitId}`} dangerouslySetInnerHTML={{ __html: entry.qrSvg }} />
      ) : (
        <p className="h-44 w-44 content-center text-sm">QR code not available</p>
      )}
      <p className="font-mono text-2xl font-bold">{entry.unitId}</p>
      <p className="text-base leading-tight">
        {entry.name}
        <br />
        {entry.depot}
      </p>
      <p className="text-xs leading-snug">
        Scan before isolating: wait for CLEAR. The manufacturer's procedure comes first.
      </p>
    </article>
  );
}
