import { useId, useMemo, useRef, useState, type ReactNode, type Ref } from 'react';
import { cn } from '#src/lib/cn';
import { controlClass, Field, fieldAria } from './field';

export interface ComboboxOption {
  value: string;
  label: string;
  /** A second line, also searched (a scientific name, a location). */
  description?: string | undefined;
}

export interface ComboboxProps {
  label: ReactNode;
  options: readonly ComboboxOption[];
  /** The chosen option's value, or '' for none. */
  value: string;
  onChange: (value: string) => void;
  onBlur?: () => void;
  hint?: ReactNode;
  error?: string | undefined;
  placeholder?: string;
  required?: boolean;
  disabled?: boolean;
  /** How many matches to list at most (the list stays short on a phone). */
  limit?: number;
  ref?: Ref<HTMLInputElement>;
  name?: string;
}

/** Folds case and accents, so "calend" finds "Calendula" and "pensee" finds "Pensée". */
const fold = (text: string) => text.normalize('NFD').replace(/\p{M}/gu, '').toLowerCase();

/**
 * A text box that lists the options matching what is typed (WAI-ARIA combobox with a listbox):
 * arrow keys move, Enter chooses, Escape closes. Typing clears the choice until one is picked.
 */
export function Combobox({
  label,
  options,
  value,
  onChange,
  onBlur,
  hint,
  error,
  placeholder,
  required,
  disabled,
  limit = 8,
  ref,
  name,
}: ComboboxProps) {
  const id = useId();
  const listId = `${id}-list`;
  const chosen = options.find((o) => o.value === value);
  const [query, setQuery] = useState<string | null>(null);
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const listRef = useRef<HTMLUListElement>(null);

  const text = query ?? chosen?.label ?? '';
  const matches = useMemo(() => {
    const q = fold((query ?? '').trim());
    const found = q
      ? options.filter(
          (o) => fold(o.label).includes(q) || (o.description ? fold(o.description).includes(q) : false),
        )
      : options;
    // Names that start with the query come first: "pe" lists Pea and Pepper before Sweet pea.
    const starts = (o: ComboboxOption) =>
      q && (fold(o.label).startsWith(q) || (o.description ? fold(o.description).startsWith(q) : false))
        ? 0
        : 1;
    return [...found].sort((a, b) => starts(a) - starts(b)).slice(0, limit);
  }, [options, query, limit]);

  const choose = (option: ComboboxOption) => {
    onChange(option.value);
    setQuery(null);
    setOpen(false);
  };

  const activeOption = open ? matches[Math.min(active, matches.length - 1)] : undefined;

  return (
    <Field id={id} label={label} hint={hint} error={error} required={required} className="relative">
      <input
        ref={ref}
        id={id}
        name={name}
        type="text"
        role="combobox"
        autoComplete="off"
        autoCapitalize="none"
        spellCheck={false}
        disabled={disabled}
        placeholder={placeholder}
        aria-expanded={open && matches.length > 0}
        aria-controls={listId}
        aria-autocomplete="list"
        aria-activedescendant={activeOption ? `${id}-opt-${activeOption.value}` : undefined}
        {...fieldAria(id, { hint, error })}
        value={text}
        onFocus={() => setOpen(true)}
        onClick={() => setOpen(true)}
        onChange={(event) => {
          setQuery(event.target.value);
          setActive(0);
          setOpen(true);
          if (value) onChange('');
        }}
        onBlur={() => {
          setOpen(false);
          // Leaving with an exact name typed out chooses it; anything else goes back to the choice.
          if (query !== null) {
            const exact = options.find((o) => fold(o.label) === fold(query.trim()));
            if (exact) onChange(exact.value);
            setQuery(null);
          }
          onBlur?.();
        }}
        onKeyDown={(event) => {
          if (event.key === 'ArrowDown') {
            event.preventDefault();
            setOpen(true);
            setActive((i) => Math.min(i + 1, matches.length - 1));
          } else if (event.key === 'ArrowUp') {
            event.preventDefault();
            setActive((i) => Math.max(i - 1, 0));
          } else if (event.key === 'Enter' && open && activeOption) {
            event.preventDefault();
            choose(activeOption);
          } else if (event.key === 'Escape' && open) {
            event.preventDefault();
            setOpen(false);
          }
        }}
        className={cn(
          controlClass(error),
          'placeholder:text-loam-500 disabled:bg-loam-100 disabled:text-loam-600',
        )}
      />
      <ul
        ref={listRef}
        id={listId}
        role="listbox"
        aria-label={typeof label === 'string' ? label : undefined}
        hidden={!open || matches.length === 0}
        className="absolute inset-x-0 top-full z-30 mt-1 max-h-80 overflow-y-auto rounded-lg border border-loam-300 bg-white py-1 shadow-lg"
      >
        {matches.map((option) => (
          <li
            key={option.value}
            id={`${id}-opt-${option.value}`}
            role="option"
            aria-selected={option === activeOption}
            // mousedown, not click: the input's blur would close the list before a click lands.
            onMouseDown={(event) => {
              event.preventDefault();
              choose(option);
            }}
            className={cn(
              'flex min-h-11 cursor-pointer flex-col justify-center px-3 py-1.5',
              option === activeOption ? 'bg-moss-100' : 'hover:bg-husk-100',
            )}
          >
            <span className="font-semibold text-loam-900">{option.label}</span>
            {option.description ? (
              <span className="text-sm italic text-loam-600">{option.description}</span>
            ) : null}
          </li>
        ))}
      </ul>
      {open && query && matches.length === 0 ? (
        <p className="text-sm text-loam-600">Nothing matches “{query}”.</p>
      ) : null}
    </Field>
  );
}
