import { useEffect, useState } from 'react';
import { useNavigate, useParams } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { cylinderCodeFrom, findCylinderByCode } from '../../../features/cylinders/api/get-cylinder';

/** A cylinder label's address (`/c/<number>`): opens the cylinder's page. */
export default function CylinderLabelPage() {
  const code = cylinderCodeFrom(useParams().code ?? '');
  const navigate = useNavigate();
  const [missing, setMissing] = useState(false);
  useEffect(() => {
    let live = true;
    findCylinderByCode(code).then(
      (c) => live && navigate(paths.cylinder.getHref(c.id), { replace: true }),
      () => live && setMissing(true),
    );
    return () => {
      live = false;
    };
  }, [code, navigate]);
  return missing ? (
    <Alert tone="alarm" title={`No cylinder ${code} in the register`}>
      Check the number on the label, or register the cylinder.
    </Alert>
  ) : (
    <p role="status" className="flex items-center gap-3 text-lg">
      <Spinner /> Opening cylinder {code}…
    </p>
  );
}
