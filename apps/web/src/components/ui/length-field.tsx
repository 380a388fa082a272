import TextField from '@mui/material/TextField';
import { type Ref, useState } from 'react';
import { type Control, Controller, type FieldValues, type Path, type RegisterOptions } from 'react-hook-form';
import { type LengthUnit, MM_PER_INCH } from '../../lib/units';
import { type BoundFieldProps } from './form-text-field';
import { NumberField } from './number-field';

type LengthFieldProps<T extends FieldValues> = Omit<BoundFieldProps<T>, 'type' | 'slotProps' | 'label'> & {
  /** The label with its unit in brackets as the form keeps it: "Margin (mm)", "Kerf (mm, optional)". */
  label: string;
  /** The unit the reader works in; the form always keeps millimetres. */
  unit: LengthUnit;
  control: Control<T>;
  rules?: RegisterOptions<T, Path<T>>;
};

/** Inches as typed back to the reader: up to four decimals, no trailing zeros ("0.25", "5.6875"). */
export function inchesText(mm: unknown): string {
  return typeof mm === 'number' && Number.isFinite(mm) ? String(Number((mm / MM_PER_INCH).toFixed(4))) : '';
}

/**
 * Millimetres of a typed number of inches (25.4 mm exactly, by definition), to the nanometre so that a
 * quarter inch is 6.35 and not 6.3500000000000005; NaN for text that is no number, as an emptied field is.
 */
export function inchesToMm(text: string): number {
  const inches = text.trim() === '' ? Number.NaN : Number(text);
  return Number.isFinite(inches) ? Math.round(inches * MM_PER_INCH * 1e6) / 1e6 : Number.NaN;
}

const NUMBER = String.raw`[−-]?\d+(?:\.\d+)?`;
const MM_RANGE = new RegExp(String.raw`(${NUMBER})( and | to |–)(${NUMBER}) mm\b`, 'g');
const MM_LENGTH = new RegExp(String.raw`(${NUMBER}) mm\b`, 'g');

/** A number as a message writes it ("−2" with a minus sign) in inches, as typed back ("0.0787"). */
function inchesOf(text: string): string {
  const mm = Number(text.replace('−', '-'));
  const inches = inchesText(Math.abs(mm));
  return mm < 0 ? `−${inches}` : inches;
}

/**
 * A form's message for a length, its millimetres said in inches for a reader who types inches: "At most
 * 100 mm" becomes "At most 3.937 in", "Between −2 and 2 mm" becomes "Between −0.0787 and 0.0787 in".
 */
export function messageInInches(message: string): string {
  return message
    .replace(MM_RANGE, (_, a: string, join: string, b: string) => `${inchesOf(a)}${join}${inchesOf(b)} in`)
    .replace(MM_LENGTH, (_, a: string) => `${inchesOf(a)} in`);
}

/**
 * A length in a form that keeps millimetres. In millimetres it is a NumberField; in inches the reader sees and
 * types inches (the label says "(in)") and the form still receives millimetres, so the spec, its checks and
 * everything saved stay in millimetres. Messages from the form's checks give their limits in inches too.
 */
export function LengthField<T extends FieldValues>({
  unit,
  control,
  label,
  form,
  name,
  rules,
  helperText,
  ...props
}: LengthFieldProps<T>) {
  if (unit === 'mm') {
    return (
      <NumberField
        {...props}
        form={form}
        name={name}
        label={label}
        helperText={helperText}
        {...(rules ? { rules } : {})}
      />
    );
  }
  return (
    <Controller
      control={control}
      name={name}
      rules={rules?.deps ? { deps: rules.deps } : undefined}
      render={({ field, fieldState }) => (
        <InchInput
          {...props}
          name={name}
          label={label.replace(/\(mm(, [^)]*)?\)$/, '(in$1)')}
          mm={field.value}
          onMm={field.onChange}
          onBlur={field.onBlur}
          inputRef={field.ref}
          error={fieldState.error?.message && messageInInches(fieldState.error.message)}
          helperText={helperText}
        />
      )}
    />
  );
}

function InchInput({
  mm,
  onMm,
  onBlur,
  error,
  helperText,
  label,
  name,
  inputRef,
  ...props
}: Omit<LengthFieldProps<FieldValues>, 'unit' | 'control' | 'form' | 'rules'> & {
  mm: unknown;
  onMm: (mm: number) => void;
  onBlur: () => void;
  error: string | undefined;
  inputRef: Ref<HTMLInputElement>;
}) {
  // While the reader types, their text stands ("0.", "1.50"); otherwise the field shows the form's value.
  const [typed, setTyped] = useState<string | null>(null);
  return (
    <TextField
      {...props}
      id={props.id ?? name}
      name={name}
      label={label}
      type="number"
      slotProps={{ htmlInput: { step: 'any' } }}
      value={typed ?? inchesText(mm)}
      onChange={(e) => {
        setTyped(e.target.value);
        onMm(inchesToMm(e.target.value));
      }}
      onBlur={() => {
        setTyped(null);
        onBlur();
      }}
      inputRef={inputRef}
      error={Boolean(error)}
      helperText={error ?? helperText}
      fullWidth
    />
  );
}
