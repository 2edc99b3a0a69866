import type { UseFormRegisterReturn } from 'react-hook-form';
import { TextField } from '../../../components/ui/field';

/** A person's refrigerant certificate: its number and its last valid day, both optional. */
export function CertificateFields(props: {
  number: UseFormRegisterReturn;
  expiresOn: UseFormRegisterReturn;
  errors: { number?: string; expiresOn?: string };
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
        error={props.errors.number}
        {...props.number}
      />
      <TextField
        label={props.expiresOnLabel}
        optional
        type="date"
        hint={props.expiresOnHint}
        error={props.errors.expiresOn}
        {...props.expiresOn}
      />
    </>
  );
}
