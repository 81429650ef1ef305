import { bootstrapApplication } from '@angular/platform-browser';
import { appConfig } from './app/app.config';
import { App } from './app/app';

/** Whether the app opens on its home page, the network map (the route with the empty path). */
const opensOnTheMap = new URL(document.baseURI).pathname === location.pathname;
// The router fetches a page's code only once sign-in has been checked; the map's is fetched now, alongside that check.
if (opensOnTheMap) import('./app/network-map/network-map.page').catch(() => undefined); // a failure is the router's to report, when it asks again

bootstrapApplication(App, appConfig).catch((error: unknown) => console.error(error));
