/**
 * Personal fields in a newsletter: `{{displayName}}`-style placeholders that the composer writes into
 * the Markdown and that are filled in for each volunteer before the Markdown is rendered.
 *
 * A value is written by the volunteer (a display name) or comes from data, never from the composer,
 * so it is escaped for Markdown before it goes in: every ASCII punctuation character gets a backslash
 * (CommonMark §2.4 allows that for all of them), which keeps `**`, `[a](javascript:b)`, `<script>`,
 * autolinks and `{{…}}` as literal text. Substitution is one pass over the template, so a value that
 * looks like a placeholder is never filled in again.
 */

export interface PersonalFields {
  displayName: string;
  verdictsThisMonth: number;
  dipsCredited: number;
  candidatesCredited: number;
  /** The campaign the volunteer gave most verdicts to; null before their first verdict. */
  topCampaign: string | null;
}

export type PersonalFieldName = keyof PersonalFields;

/** The placeholders the composer may use, in the order its help lists them. */
export const PERSONAL_FIELDS: readonly { name: PersonalFieldName; description: string }[] = [
  { name: 'displayName', description: 'The name the volunteer shows on Dipdeck.' },
  { name: 'verdictsThisMonth', description: 'How many verdicts the volunteer gave this calendar month.' },
  { name: 'dipsCredited', description: 'How many dips the volunteer is credited with finding.' },
  {
    name: 'candidatesCredited',
    description: 'How many candidates hold a dip the volunteer is credited with.',
  },
  {
    name: 'topCampaign',
    description: 'The campaign the volunteer gave most verdicts to ("none yet" before any).',
  },
];

/** What `{{topCampaign}}` says for a volunteer with no verdicts this month. */
export const NO_TOP_CAMPAIGN = 'none yet';

const FIELD_NAMES: ReadonlySet<string> = new Set(PERSONAL_FIELDS.map((field) => field.name));

// Anything between double braces counts as a placeholder, so that a misspelt one (`{{display name}}`)
// is reported too rather than silently sent.
const PLACEHOLDER = /\{\{([^{}\r\n]{0,80})\}\}/g;
const ASCII_PUNCTUATION = /[!-/:-@[-`{-~]/g;

/** `text` as Markdown that renders back to exactly `text`, on one line. */
export function escapeMarkdown(text: string): string {
  return text.replace(/\s+/g, ' ').replace(ASCII_PUNCTUATION, (character) => `\\${character}`);
}

function plainValue(fields: PersonalFields, name: PersonalFieldName): string {
  const value = fields[name];
  if (value === null) return NO_TOP_CAMPAIGN;
  if (typeof value === 'number') return value.toLocaleString('en-GB');
  return value;
}

function fill(template: string, fields: PersonalFields, encode: (value: string) => string): string {
  return template.replace(PLACEHOLDER, (placeholder, inside: string) => {
    const name = inside.trim();
    return FIELD_NAMES.has(name) ? encode(plainValue(fields, name as PersonalFieldName)) : placeholder;
  });
}

/**
 * Fills the personal fields into newsletter Markdown, each value escaped for Markdown. Unknown
 * placeholders stay as they are, so the composer sees them (see {@link unknownPlaceholders}).
 */
export function fillPersonalFields(template: string, fields: PersonalFields): string {
  return fill(template, fields, escapeMarkdown);
}

/**
 * Fills the personal fields into plain text (a headline or subject), values as they are: the caller
 * escapes for whatever it writes into.
 */
export function fillPersonalFieldsAsText(template: string, fields: PersonalFields): string {
  return fill(template, fields, (value) => value.replace(/\s+/g, ' '));
}

/** The placeholders in `template` that are no personal field, each once, in order of appearance. */
export function unknownPlaceholders(template: string): string[] {
  const unknown = new Set<string>();
  for (const match of template.matchAll(PLACEHOLDER)) {
    if (!FIELD_NAMES.has(match[1]!.trim())) unknown.add(match[0]);
  }
  return [...unknown];
}
