import { ChangeDetectionStrategy, Component } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { FormControl, ReactiveFormsModule } from '@angular/forms';

import { MeasureInputDirective } from './measure-input.directive';
import { UnitsStore } from './units.store';

@Component({
  imports: [ReactiveFormsModule, MeasureInputDirective],
  template: `<input type="number" slMeasure="spanLength" [formControl]="length" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class LengthHost {
  readonly length = new FormControl<number | null>(30.48);
}

describe('MeasureInputDirective', () => {
  let fixture: ComponentFixture<LengthHost>;
  let units: UnitsStore;

  beforeEach(async () => {
    units = TestBed.inject(UnitsStore);
    fixture = TestBed.createComponent(LengthHost);
    await fixture.whenStable();
  });

  afterEach(() => localStorage.clear());

  function box(): HTMLInputElement {
    return fixture.nativeElement.querySelector('input');
  }

  function type(text: string): void {
    box().value = text;
    box().dispatchEvent(new Event('input'));
  }

  it('shows the stored value in the current units and rewrites it when the units switch', async () => {
    expect(box().value).toBe('30.48');

    units.use('us');
    await fixture.whenStable();
    expect(box().value).toBe('100');
    expect(fixture.componentInstance.length.value).toBe(30.48);
  });

  it('hands the form the SI value of what is typed in US customary units', async () => {
    units.use('us');
    await fixture.whenStable();

    type('110');
    expect(fixture.componentInstance.length.value).toBe(33.528);

    units.use('si');
    await fixture.whenStable();
    expect(box().value).toBe('33.528');
  });

  it('hands the form null for an empty box and shows a value set by the form', async () => {
    type('');
    expect(fixture.componentInstance.length.value).toBeNull();

    fixture.componentInstance.length.setValue(12.5);
    expect(box().value).toBe('12.5');
  });

  it('marks the control touched when the box loses focus', () => {
    box().dispatchEvent(new Event('blur'));
    expect(fixture.componentInstance.length.touched).toBe(true);
  });
});
