import { Link, useLocation } from 'react-router-dom';

export function Component() {
  const { pathname } = useLocation();
  return (
    <div className="max-w-prose">
      <title>Not found · Phasewright</title>
      <p className="text-sm font-semibold tracking-wide text-accent-700 uppercase">404</p>
      <h1 className="mt-1 text-3xl font-bold text-ink-900">No page here</h1>
      <p className="mt-3 text-ink-700">
        Nothing lives at <code className="rounded bg-ink-100 px-1.5 py-0.5 text-sm">{pathname}</code>.
      </p>
      <p className="mt-4">
        <Link to="/" className="font-semibold text-accent-700 underline underline-offset-2 hover:text-accent-600">
          Go to the start page
        </Link>
      </p>
    </div>
  );
}
