import { Link } from 'react-router-dom';

export function NotFoundPage() {
  return (
    <div className="rounded-lg border border-line bg-panel p-8">
      <h1 className="text-2xl font-semibold">Page not found</h1>
      <p className="mt-2 text-muted">
        There is no page at this address. <Link to="/units" className="text-accent underline">Go to Units</Link>.
      </p>
    </div>
  );
}
