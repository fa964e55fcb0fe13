/** Entry of the analyst's page: connects the panels of the five steps, the map and the cautions to one store. */
import 'ol/ol.css';
import { api } from './api/api-client.js';
import { Store } from './app-state.js';
import { CAUTIONS, SURFACE_PRIVACY } from '../../shared/charts/cautions.js';
import { initDataPanel } from './panels/data-panel.js';
import { initMapPanel } from './panels/map-panel.js';
import { initPlanPanel } from './panels/plan-panel.js';
import { initReportPanel } from './panels/report-panel.js';
import { initResultsPanel } from './panels/results-panel.js';
import { initRunPanel } from './panels/run-panel.js';
import { el } from './ui/dom.js';

function byId<T extends HTMLElement>(id: string): T {
  const element = document.getElementById(id);
  if (!element) throw new Error(`the page lacks #${id}`);
  return element as T;
}

const store = new Store();
byId('cautions-list').replaceChildren(...CAUTIONS.map((caution) => el('li', {}, caution.startsWith('Protect the privacy') ? `${caution} ${SURFACE_PRIVACY}` : caution)));
const pick = initMapPanel(byId('map'), byId('map-caption'), byId('map-legend'), byId('map-tools'), store);
initDataPanel(byId('data-panel'), store);
initPlanPanel(byId('plan-panel'), store);
initRunPanel(byId('run-panel'), store);
initResultsPanel(byId('results-panel'), store, (sizeIndex, placementIndex) => void pick(sizeIndex, placementIndex));
initReportPanel(byId('report-panel'), store);

api
  .health()
  .then((health) => {
    store.update({ health });
    byId('server-status').textContent = `Local server ${health.version}, ${health.poolSize} worker${health.poolSize === 1 ? '' : 's'}`;
  })
  .catch((error: unknown) => {
    byId('server-status').textContent = `The local server does not answer: ${error instanceof Error ? error.message : String(error)}`;
  });
