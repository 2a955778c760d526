import type { ReactNode } from 'react';

export function Panel({ title, children, className = '' }: { title?: string; children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-lg border border-line bg-panel p-5 ${className}`}>
      {title && <h2 className="mb-4 text-xl font-semibold">{title}</h2>}
      {children}
    </section>
  );
}
