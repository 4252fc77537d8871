import { useId } from 'preact/hooks';

export interface ChoiceGroupProps<T extends string> {
  readonly legend: string;
  readonly options: readonly { readonly value: T; readonly label: string }[];
  readonly value: T;
  readonly onChange: (value: T) => void;
  readonly hint?: string;
  readonly error?: string | undefined;
}

/** Radio buttons drawn as big tiles: one tap with a glove, the chosen one marked by a tick as well as a fill. */
export function ChoiceGroup<T extends string>(props: ChoiceGroupProps<T>) {
  const name = useId();
  return (
    <fieldset class={props.error ? 'choices field-error' : 'choices'}>
      <legend>{props.legend}</legend>
      <div class="choice-row">
        {props.options.map((o) => (
          <label key={o.value} class={o.value === props.value ? 'choice choice-on' : 'choice'}>
            <input
              type="radio"
              name={name}
              value={o.value}
              checked={o.value === props.value}
              onChange={() => props.onChange(o.value)}
            />
            <span aria-hidden="true" class="choice-mark">
              {o.value === props.value ? '●' : '○'}
            </span>
            {o.label}
          </label>
        ))}
      </div>
      {props.error ? (
        <p class="help help-error">⚠ {props.error}</p>
      ) : props.hint ? (
        <p class="help">{props.hint}</p>
      ) : null}
    </fieldset>
  );
}
