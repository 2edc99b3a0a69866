import { useEffect } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { ButtonLink } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useUnitByToken } from '../../../features/units/api/get-unit-by-token';
import { isApiError } from '../../../lib/api-client';
import { Can } from '../../../lib/can';

/** Where a label scanned with the phone's own camera app lands: find the unit, then open its page in place. */
export default function LabelLinkPage() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const unit = useUnitByToken(token);

  useEffect(() => {
    if (unit.data) void navigate(paths.unit.getHref(unit.data.id), { replace: true });
  }, [unit.data, navigate]);

  if (unit.isError) {
    const unknown = isApiError(unit.error) && (unit.error.status === 404 || unit.error.status === 400);
    return (
      <Alert
        tone={unknown ? 'heed' : 'alarm'}
        title={unknown ? 'This label is not linked to any unit' : 'The unit could not be opened'}
      >
        <p>
          {unknown
            ? 'It may be an old label that was replaced. Type the container number painted on the unit instead.'
            : unit.error.message}
        </p>
        <div className="mt-3 flex flex-wrap gap-3">
          <ButtonLink to={paths.scan.getHref()}>Scan or type a number</ButtonLink>
          <Can permission="manage:units">
            <ButtonLink to={paths.newUnit.getHref()} variant="secondary">
              Register a unit
            </ButtonLink>
          </Can>
        </div>
      </Alert>
    );
  }
  return (
    <p role="status" className="flex items-center gap-3 text-lg font-semibold">
      <Spinner /> Opening the unit…
    </p>
  );
}
