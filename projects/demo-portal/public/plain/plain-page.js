// The page's own script (served from this site, as script-src 'self' requires): it listens to
// the elements' DOM events and says in one line what the widgets last heard from the service.
const status = document.getElementById('lla-events');
const names = {
  projection: 'projection',
  comparison: 'comparison',
  regime: 'regime',
  sweep: 'sweep',
};

for (const el of document.querySelectorAll('tropline-projection, tropline-comparison')) {
  const where = el.getAttribute('scenario');
  el.addEventListener('tropline-result', (event) => {
    const { kind } = event.detail;
    status.textContent = `Latest answer: ${names[kind] ?? kind} for ${where}.`;
    status.dataset[kind] = String(Number(status.dataset[kind] ?? 0) + 1);
  });
  el.addEventListener('tropline-refused', (event) => {
    status.textContent = `The service refused a request for ${where}: ${event.detail.title}.`;
  });
}
