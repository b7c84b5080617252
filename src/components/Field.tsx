import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes } from 'react';

const control =
  'block w-full rounded-md border bg-white px-3 h-10 text-[0.95rem] text-graphite-900 placeholder:text-graphite-400 ' +
  'focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200 disabled:bg-graphite-100';

function controlClass(error?: string) {
  return `${control} ${error ? 'border-fault' : 'border-graphite-300'}`;
}

type FieldFrameProps = { id: string; label: ReactNode; error?: string; hint?: ReactNode; children: ReactNode; className?: string };

/** A label above its control, the error (or a hint) right under it, tied together for screen readers. */
function FieldFrame({ id, label, error, hint, children, className = '' }: FieldFrameProps) {
  return (
    <div className={`flex flex-col gap-1 ${className}`}>
      <label htmlFor={id} className="text-sm font-semibold text-graphite-800">
        {label}
      </label>
      {children}
      {error ? (
        <p id={`${id}-msg`} className="flex items-start gap-1 text-sm font-medium text-fault" role="alert">
          <span aria-hidden className="mt-[0.3rem] inline-block size-2 shrink-0 rotate-45 bg-fault" />
          {error}
        </p>
      ) : hint ? (
        <p id={`${id}-msg`} className="text-sm text-graphite-500">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

type TextFieldProps = InputHTMLAttributes<HTMLInputElement> & {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLInputElement>;
  wrapperClassName?: string;
};

export function TextField({ label, error, hint, id, wrapperClassName, className = '', ...rest }: TextFieldProps) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <FieldFrame id={fieldId} label={label} error={error} hint={hint} className={wrapperClassName}>
      <input
        id={fieldId}
        className={`${controlClass(error)} ${className}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={error || hint ? `${fieldId}-msg` : undefined}
        {...rest}
      />
    </FieldFrame>
  );
}

type SelectFieldProps = SelectHTMLAttributes<HTMLSelectElement> & {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  ref?: Ref<HTMLSelectElement>;
  wrapperClassName?: string;
};

export function SelectField({ label, error, hint, id, wrapperClassName, className = '', children, ...rest }: SelectFieldProps) {
  const auto = useId();
  const fieldId = id ?? auto;
  return (
    <FieldFrame id={fieldId} label={label} error={error} hint={hint} className={wrapperClassName}>
      <select
        id={fieldId}
        className={`${controlClass(error)} pr-8 ${className}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={error || hint ? `${fieldId}-msg` : undefined}
        {...rest}
      >
        {children}
      </select>
    </FieldFrame>
  );
}
