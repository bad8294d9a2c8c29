/** Renderer entry: picks the API (desktop preload or browser shim), starts the worker and the app. */
import { App } from './app';
import { getApi } from './api/get-api';
import { createAnalysisClient } from './worker/client';
import { setupCharts } from './charts/setup';

setupCharts();
const app = new App(getApi(), createAnalysisClient());
void app.start();
