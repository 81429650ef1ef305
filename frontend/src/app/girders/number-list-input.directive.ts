import { Directive, ElementRef, Renderer2, effect, forwardRef, inject, input, untracked } from '@angular/core';
import { ControlValueAccessor, NG_VALUE_ACCESSOR } from '@angular/forms';

import { MeasureKind, inputText, toStoredUnits } from '../units/measures';
import { UnitsStore } from '../units/units.store';

/** How the text lays out the numbers: `numbers` "a, b, c"; `points` one "x, y" per line; `rings` point lines with a blank line between rings. */
export type NumberListLayout = 'numbers' | 'points' | 'rings';

/** A list as the form control holds it, values in SI; null for an empty box. */
export type NumberList = readonly number[] | readonly (readonly number[])[] | readonly (readonly (readonly number[])[])[];

const SEPARATOR = /[\s,;]+/;

/**
 * A text input (or textarea) for a list of numbers, typed in the user's units when `measure` is
 * set while the form control holds SI: `<input matInput slNumberList measure="sectionSize" formControlName="xMm">`.
 * Text that is not a number reaches the form as NaN, which the schemas refuse by name; switching
 * units rewrites the text from the control's value, as the single-value `slMeasure` input does.
 */
@Directive({
  selector: 'input[slNumberList], textarea[slNumberList]',
  providers: [{ provide: NG_VALUE_ACCESSOR, useExisting: forwardRef(() => NumberListInputDirective), multi: true }],
  host: {
    '(input)': 'onInput()',
    '(blur)': 'onTouched()',
  },
})
export class NumberListInputDirective implements ControlValueAccessor {
  readonly slNumberList = input<NumberListLayout, NumberListLayout | ''>('numbers', { transform: (layout) => layout || 'numbers' });
  readonly measure = input<MeasureKind | null>(null);

  private readonly units = inject(UnitsStore);
  private readonly element = inject<ElementRef<HTMLInputElement | HTMLTextAreaElement>>(ElementRef).nativeElement;
  private readonly renderer = inject(Renderer2);
  private storedValue: NumberList | null = null;
  private onChange: (value: NumberList | null) => void = () => {};
  protected onTouched: () => void = () => {};

  constructor() {
    effect(() => {
      this.units.system();
      this.measure();
      this.slNumberList();
      untracked(() => this.render());
    });
  }

  writeValue(value: NumberList | null): void {
    this.storedValue = value ?? null;
    this.render();
  }

  registerOnChange(onChange: (value: NumberList | null) => void): void {
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
    this.storedValue = text === '' ? null : this.parse(text);
    this.onChange(this.storedValue);
  }

  private parse(text: string): NumberList {
    const numbers = (part: string) => part.trim().split(SEPARATOR).filter(Boolean).map((token) => this.toStored(Number(token)));
    const lines = (part: string) => part.split('\n').filter((line) => line.trim() !== '').map(numbers);
    switch (this.slNumberList()) {
      case 'numbers':
        return numbers(text);
      case 'points':
        return lines(text);
      case 'rings':
        return text.split(/\n\s*\n/).filter((ring) => ring.trim() !== '').map(lines);
    }
  }

  private toStored(typed: number): number {
    const measure = this.measure();
    return measure === null || Number.isNaN(typed) ? typed : toStoredUnits(measure, typed, this.units.system());
  }

  private shown(value: unknown): string {
    const measure = this.measure();
    if (typeof value !== 'number' || Number.isNaN(value)) return '?';
    return measure === null ? String(value) : inputText(measure, value, this.units.system());
  }

  private render(): void {
    const value = this.storedValue;
    const line = (numbers: unknown) => (Array.isArray(numbers) ? numbers.map((n) => this.shown(n)).join(', ') : this.shown(numbers));
    const lines = (points: unknown) => (Array.isArray(points) ? points.map(line).join('\n') : line(points));
    let text = '';
    if (value !== null) {
      const layout = this.slNumberList();
      text = layout === 'numbers' ? line(value) : layout === 'points' ? lines(value) : value.map(lines).join('\n\n');
    }
    this.renderer.setProperty(this.element, 'value', text);
  }
}
