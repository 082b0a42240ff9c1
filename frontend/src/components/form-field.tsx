import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';

interface FieldFrameProps {
  label: string;
  /** The message shown under the field when its value is wrong. */
  error?: string;
  /** A short help text, always shown. */
  hint?: ReactNode;
  className?: string;
}

function describedBy(hintId: string | undefined, errorId: string | undefined): string | undefined {
  return [hintId, errorId].filter(Boolean).join(' ') || undefined;
}

function FieldFrame({
  id,
  label,
  hint,
  hintId,
  error,
  errorId,
  className = '',
  children,
}: FieldFrameProps & { id: string; hintId: string; errorId: string; children: ReactNode }) {
  return (
    <div className={`space-y-1 ${className}`}>
      <label htmlFor={id} className="block text-sm font-medium text-slate-800">
        {label}
      </label>
      {children}
      {hint && (
        <p id={hintId} className="text-xs text-slate-600">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="text-xs font-medium text-red-800">
          {error}
        </p>
      )}
    </div>
  );
}

/** Ids and ARIA links shared by every field: label → control, control → hint and error. */
function useField({ label, hint, error, className }: FieldFrameProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  return {
    frame: { id, label, hint, hintId, error, errorId, className },
    control: {
      id,
      className: 'input',
      'aria-invalid': error ? true : undefined,
      'aria-describedby': describedBy(hint ? hintId : undefined, error ? errorId : undefined),
    },
  };
}

export interface TextFieldProps extends FieldFrameProps, Omit<InputHTMLAttributes<HTMLInputElement>, 'className'> {
  ref?: Ref<HTMLInputElement>;
}

/**
 * A labelled input. The label is bound with htmlFor/id; the hint and the error are linked
 * with aria-describedby, and aria-invalid marks a wrong value, so screen readers read the
 * message with the field. Spread react-hook-form's `register(...)` into it.
 */
export function TextField({ label, error, hint, className, ref, ...input }: TextFieldProps) {
  const field = useField({ label, error, hint, className });
  return (
    <FieldFrame {...field.frame}>
      <input ref={ref} {...field.control} {...input} />
    </FieldFrame>
  );
}

export interface SelectFieldProps extends FieldFrameProps, Omit<SelectHTMLAttributes<HTMLSelectElement>, 'className'> {
  ref?: Ref<HTMLSelectElement>;
  options: ReadonlyArray<{ value: string; label: string }>;
}

/** A labelled select, wired like TextField. */
export function SelectField({ label, error, hint, className, ref, options, ...select }: SelectFieldProps) {
  const field = useField({ label, error, hint, className });
  return (
    <FieldFrame {...field.frame}>
      <select ref={ref} {...field.control} {...select}>
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}

export interface TextAreaFieldProps extends FieldFrameProps, Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'className'> {
  ref?: Ref<HTMLTextAreaElement>;
}

/** A labelled multi-line input, wired like TextField. */
export function TextAreaField({ label, error, hint, className, ref, rows = 3, ...textarea }: TextAreaFieldProps) {
  const field = useField({ label, error, hint, className });
  return (
    <FieldFrame {...field.frame}>
      <textarea ref={ref} rows={rows} {...field.control} {...textarea} />
    </FieldFrame>
  );
}

export interface CheckboxFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'className' | 'type'> {
  label: string;
  hint?: ReactNode;
  error?: string;
  className?: string;
  ref?: Ref<HTMLInputElement>;
}

/** A checkbox with its label to the right, and the hint and error linked like TextField's. */
export function CheckboxField({ label, hint, error, className = '', ref, ...input }: CheckboxFieldProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  return (
    <div className={`space-y-1 ${className}`}>
      <div className="flex items-start gap-2">
        <input
          ref={ref}
          id={id}
          type="checkbox"
          className="mt-0.5 size-4 rounded border-slate-400 accent-primary-700"
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(hint ? hintId : undefined, error ? errorId : undefined)}
          {...input}
        />
        <label htmlFor={id} className="text-sm font-medium text-slate-800">
          {label}
        </label>
      </div>
      {hint && (
        <p id={hintId} className="pl-6 text-xs text-slate-600">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="pl-6 text-xs font-medium text-red-800">
          {error}
        </p>
      )}
    </div>
  );
}
