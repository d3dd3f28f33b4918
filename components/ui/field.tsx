// A labelled form field with its error messages tied to it (aria-describedby,
// aria-invalid), so a screen reader and a sighted user both learn what is wrong.
// An error is shown as text with a marker, never by a coloured border alone.
import type { InputHTMLAttributes, ReactNode, SelectHTMLAttributes } from 'react';

interface FieldShellProps {
  id: string;
  label: string;
  hint?: string;
  errors?: string[];
  children: ReactNode;
}

export function FieldShell({ id, label, hint, errors, children }: FieldShellProps) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-bold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {hint}
        </p>
      ) : null}
      {children}
      {errors && errors.length > 0 ? (
        <ul id={`${id}-error`} className="text-sm font-bold text-fault" aria-live="polite">
          {errors.map((message) => (
            <li key={message}>
              <span aria-hidden="true">▲ </span>
              {message}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

const controlClass =
  'min-h-target rounded-md border-2 border-rule bg-panel px-3 text-base text-ink aria-[invalid=true]:border-fault aria-[invalid=true]:border-3';

function describedBy(id: string, hint?: string, errors?: string[]) {
  const ids = [hint ? `${id}-hint` : '', errors?.length ? `${id}-error` : ''].filter(Boolean);
  return ids.length ? ids.join(' ') : undefined;
}

/** the attributes every control shares: its name, its error state and the texts that describe it */
function controlProps(id: string, name: string | undefined, hint: string | undefined, errors: string[] | undefined, className: string) {
  return {
    id,
    name: name ?? id,
    'aria-invalid': errors?.length ? true : undefined,
    'aria-describedby': describedBy(id, hint, errors),
    className: `${controlClass} ${className}`,
  };
}

type InputFieldProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> & { id: string; label: string; hint?: string; errors?: string[] };

export function InputField({ id, label, hint, errors, className = '', ...props }: InputFieldProps) {
  return (
    <FieldShell id={id} label={label} hint={hint} errors={errors}>
      <input {...controlProps(id, props.name, hint, errors, className)} {...props} />
    </FieldShell>
  );
}

type SelectFieldProps = Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> & {
  id: string;
  label: string;
  hint?: string;
  errors?: string[];
  options: { value: string; label: string }[];
};

export function SelectField({ id, label, hint, errors, options, className = '', ...props }: SelectFieldProps) {
  return (
    <FieldShell id={id} label={label} hint={hint} errors={errors}>
      <select {...controlProps(id, props.name, hint, errors, className)} {...props}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldShell>
  );
}
