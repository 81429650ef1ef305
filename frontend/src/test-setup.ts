import { setupZonelessTestEnv } from 'jest-preset-angular/setup-env/zoneless';

setupZonelessTestEnv();

// jsdom lays nothing out, so it has no scrolling to offer; the list scrolls the picked structure into sight.
Element.prototype.scrollIntoView = function scrollIntoView(): void {};
