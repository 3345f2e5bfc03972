import { type FormEvent, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import type { Observatory, ObservatoryFields } from '../../api/get-observatories';

type FieldName = keyof ObservatoryFields;

interface NumberRule {
  label: string;
  min: number;
  max: number;
  fallback?: number;
}

/** The server's ranges (server/http/routes/candidates.ts), checked here first to answer at once. */
const numberRules: Record<Exclude<FieldName, 'name'>, NumberRule> = {
  latitudeDeg: { label: 'Latitude', min: -90, max: 90 },
  longitudeDeg: { label: 'Longitude', min: -180, max: 180 },
  elevationM: { label: 'Elevation', min: -500, max: 9000, fallback: 0 },
  minTargetAltitudeDeg: { label: 'Lowest target altitude', min: 0, max: 89, fallback: 30 },
  sunAltitudeLimitDeg: { label: 'Sun altitude limit', min: -90, max: 0, fallback: -12 },
};

type Draft = Record<FieldName, string>;

function draftOf(observatory: Observatory | null): Draft {
  return {
    name: observatory?.name ?? '',
    latitudeDeg: observatory ? String(observatory.latitudeDeg) : '',
    longitudeDeg: observatory ? String(observatory.longitudeDeg) : '',
    elevationM: observatory ? String(observatory.elevationM) : '0',
    minTargetAltitudeDeg: observatory ? String(observatory.minTargetAltitudeDeg) : '30',
    sunAltitudeLimitDeg: observatory ? String(observatory.sunAltitudeLimitDeg) : '-12',
  };
}

/** Reads the draft into the API's fields, or says what is wrong with each one. */
function readDraft(
  draft: Draft,
):
  | { fields: ObservatoryFields; problems: null }
  | { fields: null; problems: Partial<Record<FieldName, string>> } {
  const problems: Partial<Record<FieldName, string>> = {};
  const name = draft.name.trim();
  if (!name) problems.name = 'Name the observatory';
  else if (name.length > 120) problems.name = 'At most 120 characters';
  const numbers = {} as Record<Exclude<FieldName, 'name'>, number>;
  for (const [key, rule] of Object.entries(numberRules) as [Exclude<FieldName, 'name'>, NumberRule][]) {
    const text = draft[key].trim().replace('−', '-');
    if (text === '' && rule.fallback !== undefined) {
      numbers[key] = rule.fallback;
      continue;
    }
    const value = Number(text);
    if (text === '' || !Number.isFinite(value))
      problems[key] = `Give a number from ${rule.min} to ${rule.max}`;
    else if (value < rule.min || value > rule.max) problems[key] = `From ${rule.min} to ${rule.max}`;
    else numbers[key] = value;
  }
  if (Object.keys(problems).length > 0) return { fields: null, problems };
  return { fields: { name, ...numbers }, problems: null };
}

interface ObservatoryFormProps {
  /** The observatory being changed, or null to add one. */
  observatory: Observatory | null;
  busy: boolean;
  error: unknown;
  onSubmit: (fields: ObservatoryFields) => void;
  onCancel?: () => void;
}

export function ObservatoryForm({ observatory, busy, error, onSubmit, onCancel }: ObservatoryFormProps) {
  const [draft, setDraft] = useState<Draft>(() => draftOf(observatory));
  const [problems, setProblems] = useState<Partial<Record<FieldName, string>>>({});
  const serverFields = isApiError(error) ? error.fields : {};
  const errorFor = (name: FieldName) => problems[name] ?? serverFields[name];
  const knownField = Object.keys(serverFields).some((name) => name in draft);

  function submit(event: FormEvent) {
    event.preventDefault();
    const read = readDraft(draft);
    if (read.problems) {
      setProblems(read.problems);
      return;
    }
    setProblems({});
    onSubmit(read.fields);
  }

  const field = (name: FieldName) => ({
    value: draft[name],
    error: errorFor(name),
    onChange: (event: { target: { value: string } }) => {
      setDraft((current) => ({ ...current, [name]: event.target.value }));
    },
  });
  const numeric = { inputMode: 'decimal' as const, autoComplete: 'off' };
  const label = observatory ? `Change ${observatory.name}` : 'Add an observatory';

  return (
    <form
      noValidate
      onSubmit={submit}
      aria-label={label}
      className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-5"
    >
      <TextField
        label="Name"
        hint="As observers know it, e.g. “Roof dome, Kirkwall”."
        maxLength={120}
        autoComplete="off"
        {...field('name')}
      />
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <TextField
          label="Latitude (°)"
          hint="−90 to 90; north positive."
          {...numeric}
          {...field('latitudeDeg')}
        />
        <TextField
          label="Longitude (°)"
          hint="−180 to 180; east positive, so the Americas are negative."
          {...numeric}
          {...field('longitudeDeg')}
        />
        <TextField
          label="Elevation (m)"
          hint="Above sea level; 0 if unsure."
          {...numeric}
          {...field('elevationM')}
        />
        <TextField
          label="Lowest target altitude (°)"
          hint="0 to 89. The target must stay above this through the window; 30° keeps the airmass at 2 or less."
          {...numeric}
          {...field('minTargetAltitudeDeg')}
        />
      </div>
      <TextField
        label="Sun altitude limit (°)"
        hint="−90 to 0. The Sun must stay below this: −6° is civil, −12° nautical, −18° astronomical twilight."
        {...numeric}
        {...field('sunAltitudeLimitDeg')}
      />
      {error && !knownField ? (
        <Alert
          tone="danger"
          title={observatory ? 'Could not save the observatory' : 'Could not add the observatory'}
        >
          {isApiError(error) ? error.message : 'Something went wrong.'}
        </Alert>
      ) : null}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={busy}>
          {observatory ? 'Save changes' : 'Add observatory'}
        </Button>
        {onCancel ? (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
