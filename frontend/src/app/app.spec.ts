import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatToolbarHarness } from '@angular/material/toolbar/testing';
import { provideRouter } from '@angular/router';

import { App } from './app';

describe('App shell', () => {
  it('shows the product name in the top bar', async () => {
    TestBed.configureTestingModule({ imports: [App], providers: [provideRouter([])] });
    const fixture = TestBed.createComponent(App);
    const toolbar = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatToolbarHarness);

    expect(await toolbar.getRowsAsText()).toEqual([expect.stringMatching(/Spanledger$/)]);
  });
});
