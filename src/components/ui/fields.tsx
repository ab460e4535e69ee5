import {
  useId,
  type InputHTMLAttributes,
  type ReactNode,
  type Ref,
  type SelectHTMLAttributes,
  type TextareaHTMLAttributes,
} from 'react';

const control =
  'mt-1 block w-full min-h-11 rounded-lg border-2 border-walnut/30 bg-white px-3 py-2 text-walnut placeholder:text-walnut-soft/70 focus:border-indigo aria-[invalid=true]:border-madder';

interface FieldFrameProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  children: ReactNode;
  className?: string;
}

function FieldFrame({ id, label, hint, error, children, className = '' }: FieldFrameProps) {
  return (
    <div className={className}>
      <label htmlFor={id} className="block font-semibold">
        {label}
      </label>
      {hint && (
        <p id={`${id}-hint`} className="text-base text-walnut-soft">
          {hint}
        </p>
      )}
      {children}
      {error && (
        <p id={`${id}-error`} role="alert" className="mt-1 font-semibold text-madder-deep">
          {error}
        </p>
      )}
    </div>
  );
}

function describedBy(id: string, hint?: ReactNode, error?: string, unit?: ReactNode) {
  return (
    [unit ? `${id}-unit` : null, hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined
  );
}

interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLInputElement>;
  wrapperClassName?: string;
  /** The unit a bare number is read in ("in", "mm"), shown beside the box and read out with it. */
  unit?: string;
}

const unitNames: Record<string, string> = { in: 'inches', mm: 'millimetres' };

/** A labelled input with its hint and error beside it, for react-hook-form's register(). */
export function TextField({ label, hint, error, id, ref, wrapperClassName, unit, className = '', ...rest }: TextFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  const input = (
    <input
      ref={ref}
      id={fieldId}
      className={`${control} ${className}`}
      aria-invalid={error ? true : undefined}
      aria-describedby={describedBy(fieldId, hint, error, unit)}
      {...rest}
    />
  );
  return (
    <FieldFrame id={fieldId} label={label} hint={hint} error={error} className={wrapperClassName}>
      {unit ? (
        <div className="flex items-stretch gap-2">
          <div className="min-w-0 flex-1">{input}</div>
          <span
            id={`${fieldId}-unit`}
            className="mt-1 inline-flex min-w-12 items-center justify-center rounded-lg bg-linen-deep px-2 font-semibold"
          >
            <span aria-hidden="true">{unit}</span>
            <span className="sr-only">{`in ${unitNames[unit] ?? unit}`}</span>
          </span>
        </div>
      ) : (
        input
      )}
    </FieldFrame>
  );
}

interface TextAreaProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLTextAreaElement>;
  wrapperClassName?: string;
}

export function TextArea({ label, hint, error, id, ref, wrapperClassName, className = '', ...rest }: TextAreaProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <FieldFrame id={fieldId} label={label} hint={hint} error={error} className={wrapperClassName}>
      <textarea
        ref={ref}
        id={fieldId}
        className={`${control} min-h-24 ${className}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(fieldId, hint, error)}
        {...rest}
      />
    </FieldFrame>
  );
}

interface SelectFieldProps extends SelectHTMLAttributes<HTMLSelectElement> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLSelectElement>;
  options: { value: string; label: string }[];
  wrapperClassName?: string;
}

export function SelectField({
  label,
  hint,
  error,
  id,
  ref,
  options,
  wrapperClassName,
  className = '',
  ...rest
}: SelectFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <FieldFrame id={fieldId} label={label} hint={hint} error={error} className={wrapperClassName}>
      <select
        ref={ref}
        id={fieldId}
        className={`${control} ${className}`}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(fieldId, hint, error)}
        {...rest}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}
