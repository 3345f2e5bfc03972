import type { Answer } from '../lib/cards';

interface VerdictButtonsProps {
  onVerdict: (answer: Answer) => void;
  disabled?: boolean;
}

const buttons: { answer: Answer; label: string; key: string; hint: string; className: string }[] = [
  {
    answer: 'flat',
    label: 'Flat',
    key: '←',
    hint: 'or swipe left',
    className: 'bg-slate-wash text-slate border-slate hover:bg-slate hover:text-paper',
  },
  {
    answer: 'unsure',
    label: 'Unsure',
    key: '↑',
    hint: 'or swipe up',
    className: 'bg-surface text-ink border-edge hover:border-ink hover:bg-paper',
  },
  {
    answer: 'dip',
    label: 'Dip',
    key: '→',
    hint: 'or swipe right',
    className: 'bg-amber-wash text-amber-ink border-amber hover:bg-amber hover:text-ink',
  },
];

/** The three verdicts as buttons: every swipe has one (WCAG 2.5.1, 2.5.7), each well over 44 × 44 px. */
export function VerdictButtons({ onVerdict, disabled = false }: VerdictButtonsProps) {
  return (
    <fieldset className="grid grid-cols-3 gap-2 md:gap-3">
      <legend className="sr-only">Your verdict</legend>
      {buttons.map((button) => (
        <button
          key={button.answer}
          type="button"
          disabled={disabled}
          aria-keyshortcuts={button.key === '→' ? 'ArrowRight' : button.key === '←' ? 'ArrowLeft' : 'ArrowUp'}
          onClick={() => onVerdict(button.answer)}
          className={`flex min-h-14 flex-col items-center justify-center rounded-md border-2 px-2 py-1.5 font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${button.className}`}
        >
          <span className="flex items-center gap-1.5 text-lg">
            {button.answer === 'flat' ? <span aria-hidden="true">←</span> : null}
            {button.answer === 'unsure' ? <span aria-hidden="true">↑</span> : null}
            {button.label}
            {button.answer === 'dip' ? <span aria-hidden="true">→</span> : null}
          </span>
          <span aria-hidden="true" className="hidden text-xs font-normal md:block">
            {button.hint}
          </span>
        </button>
      ))}
    </fieldset>
  );
}
