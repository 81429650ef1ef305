import { ComponentHarness } from '@angular/cdk/testing';

/** One row of the structure list, read as a user sees it. */
export class StructureListItemHarness extends ComponentHarness {
  static hostSelector = '[data-testid="structure-list-item"]';

  private readonly title = this.locatorFor('[data-testid="structure-list-title"]');
  private readonly crossing = this.locatorFor('[data-testid="structure-list-crossing"]');
  private readonly place = this.locatorFor('[data-testid="structure-list-place"]');

  async getStructureNumber(): Promise<string | null> {
    return (await this.host()).getAttribute('data-structure-number');
  }

  async getTitle(): Promise<string> {
    return (await this.title()).text();
  }

  async getCrossing(): Promise<string> {
    return (await this.crossing()).text();
  }

  async getPlace(): Promise<string> {
    return (await this.place()).text();
  }

  async isSelected(): Promise<boolean> {
    return (await (await this.host()).getAttribute('aria-current')) === 'true';
  }

  async click(): Promise<void> {
    return (await this.host()).click();
  }
}

/** The list of structures in view beside the map. */
export class StructureListHarness extends ComponentHarness {
  static hostSelector = 'sl-structure-list';

  readonly getItems = this.locatorForAll(StructureListItemHarness);

  async getStructureNumbers(): Promise<(string | null)[]> {
    return Promise.all((await this.getItems()).map((item) => item.getStructureNumber()));
  }
}
