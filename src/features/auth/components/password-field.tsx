import { useState } from 'react';
import { TextField, type TextFieldProps } from '#src/components/ui/text-field';

/** A password field with a "show" switch: easier to type right on a phone with soil on your hands. */
export function PasswordField(props: Omit<TextFieldProps, 'type'>) {
  const [visible, setVisible] = useState(false);
  return (
    <div className="flex flex-col gap-1">
      <TextField {...props} type={visible ? 'text' : 'password'} />
      <label className="inline-flex min-h-11 items-center gap-2 self-start text-sm font-semibold text-loam-700">
        <input
          type="checkbox"
          className="size-5 accent-moss-700"
          checked={visible}
          onChange={(event) => setVisible(event.target.checked)}
        />
        Show password
      </label>
    </div>
  );
}
