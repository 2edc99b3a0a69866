import type { UseFormRegisterReturn } from 'react-hook-form';
import { TextField } from '../../../components/ui/field';

type CertificateField = 'certificateNumber' | 'certificateExpiresOn';

/** A person's refrigerant certificate: its number and its last valid day, both optional. */
export function CertificateFields(props: {
  register: (name: CertificateField) => UseFormRegisterReturn;
  errors: Partial<Record<CertificateField, { message?: string }>>;
  numberHint?: string;
  expiresOnLabel: string;
  expiresOnHint: string;
}) {
  return (
    <>
      <TextField
        label="Certificate number"
        optional
        hint={props.numberHint}
        autoComplete="off"
        spellCheck={false}
        error={props.errors.certificateNumber?.message}
        {...props.register('certificateNumber')}
      />
      <TextField
        label={props.expiresOnLabel}
        optional
        type="date"
        hint={props.expiresOnHint}
        error={props.errors.certificateExpiresOn?.message}
        {...props.register('certificateExpiresOn')}
      />
    </>
  );
}
