import { TestBed } from '@angular/core/testing';

import { UNIT_SYSTEM_STORAGE_KEY, UnitsStore } from './units.store';

describe('UnitsStore', () => {
  afterEach(() => localStorage.clear());

  it('starts in SI when nothing is remembered', () => {
    expect(TestBed.inject(UnitsStore).system()).toBe('si');
  });

  it('starts in the system this browser remembers', () => {
    localStorage.setItem(UNIT_SYSTEM_STORAGE_KEY, 'us');
    expect(TestBed.inject(UnitsStore).system()).toBe('us');
  });

  it('ignores a remembered value it does not know', () => {
    localStorage.setItem(UNIT_SYSTEM_STORAGE_KEY, 'imperial');
    expect(TestBed.inject(UnitsStore).system()).toBe('si');
  });

  it('remembers a switch and follows it in labels and formatted values', () => {
    const units = TestBed.inject(UnitsStore);
    expect(units.labels().spanLength).toBe('m');

    units.use('us');

    expect(localStorage.getItem(UNIT_SYSTEM_STORAGE_KEY)).toBe('us');
    expect(units.labels().spanLength).toBe('ft');
    expect(units.format('spanLength', 30.48, { withUnit: true })).toBe('100.00 ft');
  });
});
