import TextField from '@mui/material/TextField';
import { type Ref, useState } from 'react';
import { type Control, Controller, type FieldValues, type Path, type RegisterOptions } from 'react-hook-form';
import { inchNumber, type LengthUnit, MM_PER_INCH } from '../../lib/units';
import { type BoundFieldProps } from './form-text-field';
import { NumberField } from './number-field';

type LengthFieldProps<T extends FieldValues> = Omit<BoundFieldProps<T>, 'type' | 'slotProps' | 'label'> & {
  /**
   * The label with its unit in brackets as the form keeps it: "Margin (mm)", "Kerf (mm, optional)", or a speed
   * "Cut speed (mm/s)" (millimetres per second, shown as inches per second).
   */
  label: string;
  /** The unit the reader works in; the form always keeps millimetres. */
  unit: LengthUnit;
  control: Control<T>;
  rules?: RegisterOptions<T, Path<T>>;
  /**
   * Decimals the inches are shown to (4 unless said): KERF_INCH_DECIMALS for a kerf, a tool diameter or a fit,
   * so that a value shown and typed back is the one stored.
   */
  inchDecimals?: number;
};

/**
 * Inches as typed back to the reader: up to `decimals` (four), no more than bring them within half a micrometre
 * of the millimetres kept, no trailing zeros ("0.25", "5.6875"); as formatKerf shows them for KERF_INCH_DECIMALS.
 */
export function inchesText(mm: unknown, decimals = 4): string {
  return typeof mm === 'number' && Number.isFinite(mm) ? inchNumber(mm, decimals) : '';
}

/** A length field's label as shown in inches: "Kerf (mm, optional)" → "Kerf (in, optional)", "(mm/s)" → "(in/s)". */
export function inchLabel(label: string): string {
  return label.replace(/\(mm(\/s)?(, [^)]*)?\)$/, '(in$1$2)');
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
/** Which way a limit is rounded to the inch's four decimals: inward, so the value said is one the check takes. */
type Inward = 'up' | 'down' | 'nearest';

/** A number as a message writes it ("−2" with a minus sign) in inches to four decimals, rounded `way`. */
function inchesOf(text: string, way: Inward): string {
  const inches = Number(text.replace('−', '-')) / MM_PER_INCH;
  const round = way === 'up' ? Math.ceil : way === 'down' ? Math.floor : Math.round;
  // A hair off whole ten-thousandths (floating point) is not rounded a whole step away.
  const r = round(Number((inches * 1e4).toFixed(6))) / 1e4;
  const abs = String(Number(Math.abs(r).toFixed(4)));
  return r < 0 ? `−${abs}` : abs;
}

/** The way a lone limit rounds, from the words before it: "At most" down, "At least" and "more than" up. */
function wayBefore(text: string): Inward {
  if (/\bat most\s*$/i.test(text)) return 'down';
  if (/\b(at least|more than)\s*$/i.test(text)) return 'up';
  return 'nearest';
}

/**
 * A form's message for a length, its millimetres said in inches for a reader who types inches: "At most
 * 100 mm" becomes "At most 3.937 in", "Between −2 and 2 mm" becomes "Between −0.0787 and 0.0787 in". Limits
 * are rounded inward (a maximum down, a minimum up), so that typing the value said is accepted.
 */
export function messageInInches(message: string): string {
  return message
    .replace(
      MM_RANGE,
      (_, a: string, join: string, b: string) => `${inchesOf(a, 'up')}${join}${inchesOf(b, 'down')} in`,
    )
    .replace(MM_LENGTH, (_, a: string, offset: number, whole: string) => {
      return `${inchesOf(a, wayBefore(whole.slice(0, offset)))} in`;
    });
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
  inchDecimals,
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
          label={inchLabel(label)}
          mm={field.value}
          decimals={inchDecimals ?? 4}
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
  decimals,
  onMm,
  onBlur,
  error,
  helperText,
  label,
  name,
  inputRef,
  ...props
}: Omit<LengthFieldProps<FieldValues>, 'unit' | 'control' | 'form' | 'rules' | 'inchDecimals'> & {
  mm: unknown;
  decimals: number;
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
      value={typed ?? inchesText(mm, decimals)}
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
