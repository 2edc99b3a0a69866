import { ROLE_LABELS } from '../../../../shared/permissions';
import { ButtonLink } from '../../../components/ui/button';
import { PeopleIcon } from '../../../components/ui/icons';
import { Panel } from '../../../components/ui/page';
import { paths } from '../../../config/paths';
import { MyDay } from '../../../features/day/components/my-day';
import { FindUnitForm } from '../../../features/units/components/find-unit-form';
import { useUser } from '../../../lib/auth';
import { Can } from '../../../lib/can';

function greeting(now: Date): string {
  const hour = now.getHours();
  if (hour < 5) return 'Working late';
  if (hour < 12) return 'Good morning';
  if (hour < 18) return 'Good afternoon';
  return 'Good evening';
}

export default function HomePage() {
  const user = useUser();
  const firstName = user.name.trim().split(/\s+/)[0] || user.name;

  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">
          {greeting(new Date())}, {firstName}
        </h1>
        <p className="mt-1 text-base text-ink-600">Signed in as {ROLE_LABELS[user.role].toLowerCase()}.</p>
      </div>

      <MyDay />

      <Panel aria-labelledby="find-unit-title">
        <h2 id="find-unit-title" className="mb-3 text-xl font-bold">
          Find a unit
        </h2>
        <FindUnitForm />
      </Panel>

      <Can permission="manage:users">
        <Panel aria-labelledby="people-card-title" className="flex flex-wrap items-center justify-between gap-4">
          <div className="flex items-center gap-3">
            <PeopleIcon className="size-8 text-fjord-700" />
            <div>
              <h2 id="people-card-title" className="text-lg font-bold">
                People
              </h2>
              <p className="text-sm text-ink-600">Add accounts, change roles, deactivate leavers.</p>
            </div>
          </div>
          <ButtonLink to={paths.people.getHref()} variant="secondary">
            Manage accounts
          </ButtonLink>
        </Panel>
      </Can>
    </div>
  );
}
