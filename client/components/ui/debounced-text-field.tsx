import { forwardRef, useEffect, useRef, useState } from 'react';
import { TextField, type TextFieldProps } from './text-field';

export interface DebouncedTextFieldProps extends Omit<TextFieldProps, 'value' | 'onChange' | 'defaultValue'> {
  /** The committed value (from the URL, say); the field follows it when it changes elsewhere. */
  value: string;
  /** Called a moment after typing stops, or at once on Enter. */
  onCommit: (text: string) => void;
  delay?: number;
}

/**
 * A text filter that does not send a request per keystroke: what is typed
 * shows at once, and is committed after a short pause (or on Enter).
 */
export const DebouncedTextField = forwardRef<HTMLInputElement, DebouncedTextFieldProps>(function DebouncedTextField(
  { value, onCommit, delay = 400, onKeyDown, ...rest },
  ref,
) {
  const [text, setText] = useState(value);
  const committed = useRef(value);
  const commit = useRef(onCommit);
  commit.current = onCommit;

  useEffect(() => {
    if (value !== committed.current) {
      committed.current = value;
      setText(value);
    }
  }, [value]);

  useEffect(() => {
    if (text === committed.current) return;
    const timer = setTimeout(() => {
      committed.current = text;
      commit.current(text);
    }, delay);
    return () => clearTimeout(timer);
  }, [text, delay]);

  return (
    <TextField
      ref={ref}
      value={text}
      onChange={(event) => setText(event.target.value)}
      onKeyDown={(event) => {
        onKeyDown?.(event);
        if (event.key === 'Enter' && text !== committed.current) {
          event.preventDefault();
          committed.current = text;
          commit.current(text);
        }
      }}
      {...rest}
    />
  );
});
