import { Directive, ElementRef, Renderer2, effect, forwardRef, inject, input, untracked } from '@angular/core';
import { ControlValueAccessor, NG_VALUE_ACCESSOR } from '@angular/forms';

import { MeasureKind, inputText, toStoredUnits } from './measures';
import { UnitsStore } from './units.store';

/**
 * A number input that shows and takes a value in the user's units while its form control holds
 * the stored SI value: `<input type="number" matInput slMeasure="spanLength" formControlName="lengthM">`.
 * Switching units rewrites the text from the control's value, so an untouched value never drifts.
 */
@Directive({
  selector: 'input[slMeasure]',
  providers: [{ provide: NG_VALUE_ACCESSOR, useExisting: forwardRef(() => MeasureInputDirective), multi: true }],
  host: {
    inputmode: 'decimal',
    '(input)': 'onInput()',
    '(blur)': 'onTouched()',
  },
})
export class MeasureInputDirective implements ControlValueAccessor {
  readonly slMeasure = input.required<MeasureKind>();

  private readonly units = inject(UnitsStore);
  private readonly element = inject<ElementRef<HTMLInputElement>>(ElementRef).nativeElement;
  private readonly renderer = inject(Renderer2);
  private storedValue: number | null = null;
  private onChange: (value: number | null) => void = () => {};
  protected onTouched: () => void = () => {};

  constructor() {
    effect(() => {
      this.units.system();
      this.slMeasure();
      untracked(() => this.render());
    });
  }

  writeValue(value: number | null): void {
    this.storedValue = value ?? null;
    this.render();
  }

  registerOnChange(onChange: (value: number | null) => void): void {
    this.onChange = onChange;
  }

  registerOnTouched(onTouched: () => void): void {
    this.onTouched = onTouched;
  }

  setDisabledState(disabled: boolean): void {
    this.renderer.setProperty(this.element, 'disabled', disabled);
  }

  protected onInput(): void {
    const text = this.element.value.trim();
    const typed = text === '' ? null : Number(text);
    // Text that is not a number yet is left alone in the box and reaches the form as NaN, which the schemas refuse.
    this.storedValue = typed === null || Number.isNaN(typed) ? typed : toStoredUnits(this.slMeasure(), typed, this.units.system());
    this.onChange(this.storedValue);
  }

  private render(): void {
    const value = this.storedValue;
    const text = value === null || Number.isNaN(value) ? '' : inputText(this.slMeasure(), value, this.units.system());
    this.renderer.setProperty(this.element, 'value', text);
  }
}
