import { useId } from 'preact/hooks';

export interface TextFieldProps {
  readonly label: string;
  readonly value: string;
  readonly onChange: (value: string) => void;
  readonly hint?: string;
  readonly error?: string | undefined;
  readonly inputMode?: 'text' | 'numeric' | 'decimal';
  readonly required?: boolean;
  readonly multiline?: boolean;
  readonly autoComplete?: string;
}

/** A labelled text box with its hint, or its problem in words, right under it. */
export function TextField(props: TextFieldProps) {
  const id = useId();
  const help = `${id}-help`;
  const common = {
    id,
    value: props.value,
    'aria-invalid': props.error ? ('true' as const) : ('false' as const),
    'aria-describedby': help,
    autoComplete: props.autoComplete ?? 'off',
  };
  return (
    <div class={props.error ? 'field field-error' : 'field'}>
      <label for={id}>
        {props.label}
        {props.required ? '' : <span class="optional"> (optional)</span>}
      </label>
      {props.multiline ? (
        <textarea
          {...common}
          rows={2}
          onInput={(e) => props.onChange((e.target as HTMLTextAreaElement).value)}
        />
      ) : (
        <input
          {...common}
          type="text"
          inputMode={props.inputMode ?? 'text'}
          onInput={(e) => props.onChange((e.target as HTMLInputElement).value)}
        />
      )}
      <p id={help} class={props.error ? 'help help-error' : 'help'}>
        {props.error ? `⚠ ${props.error}` : (props.hint ?? '')}
      </p>
    </div>
  );
}
