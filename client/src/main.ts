// Entry of the analyst's page (being built: see issue on the page).
const app = document.getElementById('app');
if (app) app.textContent = 'gridshake';
