import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

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

function describedBy(id: string, hint?: ReactNode, error?: string) {
  return [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
}

interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLInputElement>;
  wrapperClassName?: string;
}

/** A labelled input with its hint and error beside it, for react-hook-form's register(). */
export function TextField({ label, hint, error, id, ref, wrapperClassName, className = '', ...rest }: TextFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <FieldFrame id={fieldId} label={label} hint={hint} error={error} className={wrapperClassName}>
      <input ref={ref} id={fieldId} className={`${control} ${className}`} aria-invalid={error ? true : undefined} aria-describedby={describedBy(fieldId, hint, error)} {...rest} />
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
      <textarea ref={ref} id={fieldId} className={`${control} min-h-24 ${className}`} aria-invalid={error ? true : undefined} aria-describedby={describedBy(fieldId, hint, error)} {...rest} />
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

export function SelectField({ label, hint, error, id, ref, options, wrapperClassName, className = '', ...rest }: SelectFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <FieldFrame id={fieldId} label={label} hint={hint} error={error} className={wrapperClassName}>
      <select ref={ref} id={fieldId} className={`${control} ${className}`} aria-invalid={error ? true : undefined} aria-describedby={describedBy(fieldId, hint, error)} {...rest}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}
