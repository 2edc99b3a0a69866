import { paths } from '../../config/paths';
import { ButtonLink } from '../ui/button';

export function NotFound() {
  return (
    <section aria-labelledby="not-found-title" className="flex max-w-xl flex-col items-start gap-4 py-2">
      <p className="text-figure font-bold text-ink-400 tabular-nums">404</p>
      <h1 id="not-found-title" className="text-2xl font-bold tracking-tight md:text-3xl">
        There is no page here
      </h1>
      <p className="text-base text-ink-700">
        The link may be old or mistyped. To reach a unit, search for its container number from Home or scan its label.
      </p>
      <ButtonLink to={paths.home.getHref()} variant="primary">
        Go to the start page
      </ButtonLink>
    </section>
  );
}
