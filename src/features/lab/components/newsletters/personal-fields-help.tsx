import { PERSONAL_FIELDS, type PersonalFieldName, placeholderOf } from '../../lib/newsletters';

/** The personal fields, each a button that puts its placeholder where the writer's caret is. */
export function PersonalFieldsHelp({ onInsert }: { onInsert: (name: PersonalFieldName) => void }) {
  return (
    <section aria-labelledby="personal-fields-heading" className="flex flex-col gap-2">
      <h3 id="personal-fields-heading" className="text-sm font-medium text-ink">
        Personal fields
      </h3>
      <p className="text-sm text-muted">
        Each reader gets their own value. Tap one to put it in the text where you are typing.
      </p>
      <ul className="flex flex-col gap-1.5">
        {PERSONAL_FIELDS.map((field) => (
          <li key={field.name} className="flex flex-col gap-1 sm:flex-row sm:items-center sm:gap-3">
            <button
              type="button"
              onClick={() => onInsert(field.name)}
              aria-label={`Insert ${placeholderOf(field.name)}: ${field.description}`}
              className="inline-flex min-h-target w-fit shrink-0 items-center rounded-full border border-edge bg-surface px-3 font-mono text-sm text-ink hover:border-ink hover:bg-amber-wash"
            >
              {placeholderOf(field.name)}
            </button>
            <span className="text-sm text-muted">{field.description}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
