import { useState } from 'react';
import { Button } from './button';

/** Copies `text` to the clipboard and says whether it worked. */
export function CopyButton({ text, label = 'Copy' }: { text: string; label?: string }) {
  const [status, setStatus] = useState<'idle' | 'copied' | 'failed'>('idle');
  async function copy() {
    try {
      await navigator.clipboard.writeText(text);
      setStatus('copied');
    } catch {
      setStatus('failed');
    }
  }
  return (
    <span className="inline-flex items-center gap-2">
      <Button size="sm" onClick={copy}>
        {label}
      </Button>
      <span aria-live="polite" className="text-sm text-muted">
        {status === 'copied' ? 'Copied.' : status === 'failed' ? 'Could not copy; select the text and copy it by hand.' : ''}
      </span>
    </span>
  );
}
