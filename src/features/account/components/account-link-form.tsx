import type { ReactNode } from 'react';
import { useNavigate } from 'react-router-dom';
import type { AccountLinkDto } from '../../../../shared/schemas/account';
import { ButtonLink } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useAccountLink, useCompleteAccountLink } from '../api/account-links';
import type { AccountLinkPurpose } from '../api/keys';
import { LinkProblem } from './link-problem';
import { SetPasswordForm } from './set-password-form';

/**
 * The page behind a link in a mail (an invitation or a password reset): the link is checked, then the person
 * chooses a password and is signed in.
 */
export function AccountLinkForm({
  purpose,
  token,
  title,
  checking,
  problemAction,
  intro,
  submitLabel,
  pendingLabel,
}: {
  purpose: AccountLinkPurpose;
  token: string;
  title: string;
  /** Shown while the link is checked. */
  checking: string;
  /** Where to go when the link does not work. */
  problemAction: { to: string; label: string };
  intro: (link: AccountLinkDto) => ReactNode;
  submitLabel: string;
  pendingLabel: string;
}) {
  const navigate = useNavigate();
  const link = useAccountLink(purpose, token);
  const complete = useCompleteAccountLink(purpose, token);

  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">{title}</h1>
      {link.isPending ? (
        <p className="flex items-center gap-3 text-ink-700">
          <Spinner /> {checking}
        </p>
      ) : link.isError ? (
        <LinkProblem error={link.error}>
          <ButtonLink to={problemAction.to} variant="secondary">
            {problemAction.label}
          </ButtonLink>
        </LinkProblem>
      ) : (
        <>
          <p className="text-ink-700">{intro(link.data)}</p>
          <SetPasswordForm
            person={{ email: link.data.email, name: link.data.name }}
            submitLabel={submitLabel}
            pendingLabel={pendingLabel}
            pending={complete.isPending}
            error={complete.error}
            onSubmit={(password) =>
              complete.mutate(password, { onSuccess: () => navigate(paths.home.getHref(), { replace: true }) })
            }
          />
        </>
      )}
    </div>
  );
}
