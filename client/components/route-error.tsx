import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { buttonClass } from './button';
import { paths } from '../config/paths';
import { isApiError } from '../lib/api-client';

interface Explained {
  title: string;
  message: string;
}

/** Turns whatever a route threw (an `ApiError`, a router 404, a bug) into words for the user. */
export function explainRouteError(error: unknown): Explained {
  const status = isApiError(error) ? error.status : isRouteErrorResponse(error) ? error.status : undefined;
  if (status === 404)
    return {
      title: 'Nothing here',
      message: isApiError(error) ? error.message : 'This page does not exist, or it has moved.',
    };
  if (status === 403)
    return { title: 'Not yours to open', message: isApiError(error) ? error.message : 'Your role does not allow this.' };
  if (isApiError(error)) return { title: 'The server could not answer', message: error.message };
  return {
    title: 'Something broke on this page',
    message: 'Reload the page to try again. If it keeps happening, tell the team what you were doing.',
  };
}

/** The error boundary of every route: it keeps the app bar (when inside the layout) and offers a way on. */
export function RouteError() {
  const error = useRouteError();
  const { title, message } = explainRouteError(error);
  return (
    <section role="alert" aria-labelledby="route-error-title" className="mx-auto my-12 max-w-xl rounded-2xl border border-rule bg-card p-8 shadow-sm">
      <h1 id="route-error-title" className="text-2xl font-extrabold">
        {title}
      </h1>
      <p className="mt-2 text-ink-soft">{message}</p>
      <div className="mt-6 flex flex-wrap gap-3">
        <Link to={paths.rooms.getHref()} className={buttonClass('primary')}>
          Back to your rooms
        </Link>
        <button type="button" className={buttonClass('secondary')} onClick={() => window.location.reload()}>
          Reload
        </button>
      </div>
    </section>
  );
}
