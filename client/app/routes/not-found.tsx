import { Link } from 'react-router-dom';
import { buttonClass } from '../../components/button';
import { Wordmark } from '../../components/wordmark';
import { paths } from '../../config/paths';

export default function NotFoundRoute() {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-4 px-4 text-center">
      <Wordmark size={36} />
      <h1 className="text-3xl font-extrabold">This page is not on the chart</h1>
      <p className="max-w-md text-ink-soft">The address does not lead anywhere in Matchloom. It may have been mistyped, or the room may have moved.</p>
      <Link to={paths.rooms.getHref()} className={buttonClass('primary')}>
        Back to your rooms
      </Link>
    </main>
  );
}
