import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';

import { UNIT_SYSTEM_STORAGE_KEY, UnitsStore } from './units.store';
import { UnitsSwitchComponent } from './units-switch.component';

describe('UnitsSwitchComponent', () => {
  afterEach(() => localStorage.clear());

  async function buttons(): Promise<{ si: MatButtonHarness; us: MatButtonHarness }> {
    const loader = TestbedHarnessEnvironment.loader(TestBed.createComponent(UnitsSwitchComponent));
    return {
      si: await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="units-si"]' })),
      us: await loader.getHarness(MatButtonHarness.with({ selector: '[data-testid="units-us"]' })),
    };
  }

  async function pressed(button: MatButtonHarness): Promise<string | null> {
    return (await button.host()).getAttribute('aria-pressed');
  }

  it('shows the current system as pressed', async () => {
    localStorage.setItem(UNIT_SYSTEM_STORAGE_KEY, 'us');
    const { si, us } = await buttons();

    expect(await pressed(si)).toBe('false');
    expect(await pressed(us)).toBe('true');
  });

  it('switches the whole app to US customary units and back, remembering the choice', async () => {
    const units = TestBed.inject(UnitsStore);
    const { si, us } = await buttons();

    await us.click();
    expect(units.system()).toBe('us');
    expect(localStorage.getItem(UNIT_SYSTEM_STORAGE_KEY)).toBe('us');
    expect(await pressed(us)).toBe('true');

    await si.click();
    expect(units.system()).toBe('si');
    expect(await pressed(si)).toBe('true');
    expect(await pressed(us)).toBe('false');
  });
});
