import { paths } from '../../config/paths';
import { ButtonLink } from '../ui/button';
import { LockIcon } from '../ui/icons';

/** Shown in place of a page the signed-in user's role does not cover (and for a 403 from the server). */
export function NotAllowed({ roleLabel }: { roleLabel?: string }) {
  return (
    <section
      data-testid="not-allowed"
      aria-labelledby="not-allowed-title"
      className="flex max-w-xl flex-col items-start gap-4 rounded-lg border-2 border-ink-950 bg-white p-6 md:p-8"
    >
      <span className="flex size-14 items-center justify-center rounded-full bg-heed-50 text-heed-800">
        <LockIcon className="size-8" />
      </span>
      <h1 id="not-allowed-title" className="text-2xl font-bold tracking-tight">
        Not allowed
      </h1>
      <p className="text-base text-ink-700">
        {roleLabel ? (
          <>
            Your role, <strong>{roleLabel}</strong>, does not include this page.
          </>
        ) : (
          'Your role does not include this page.'
        )}{' '}
        If you need it for your work, ask an administrator to change your role.
      </p>
      <ButtonLink to={paths.home.getHref()} variant="secondary">
        Go to the start page
      </ButtonLink>
    </section>
  );
}
