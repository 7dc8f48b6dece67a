import { TextField } from '@client/components/ui/text-field';
import type { FieldProps } from '@client/lib/form-errors';

/** A new password and the same again, where one is chosen (changing it, resetting it by e-mail). */
export function NewPasswordFields({ password, repeat }: { password: FieldProps; repeat: FieldProps }) {
  return (
    <>
      <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." {...password} />
      <TextField label="New password again" type="password" autoComplete="new-password" {...repeat} />
    </>
  );
}
