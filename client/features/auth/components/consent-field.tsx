import { forwardRef } from 'react';
import { Link } from 'react-router-dom';
import { CheckboxField, type CheckboxFieldProps } from '@client/components/ui/checkbox-field';

/** The consent a new account needs: the terms of use and the privacy notice, each a link that opens beside the form. */
export const ConsentField = forwardRef<HTMLInputElement, Omit<CheckboxFieldProps, 'label' | 'hint'>>(function ConsentField(props, ref) {
  return (
    <CheckboxField
      ref={ref}
      label="I accept the terms of use and the privacy notice"
      hint={
        <>
          Read the{' '}
          <Link to="/terms" target="_blank" className="underline">
            terms of use
          </Link>{' '}
          and the{' '}
          <Link to="/privacy" target="_blank" className="underline">
            privacy notice
          </Link>{' '}
          (each opens in a new tab).
        </>
      }
      {...props}
    />
  );
});
