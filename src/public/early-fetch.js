// The first page's API requests, started while the app's code is still downloading and starting
// up; src/lib/api-client.ts takes each answer once, for the same URL. On a slow tablet this takes
// the server's time off the wait for the first weights. A plain script, copied as it is (Vite
// `publicDir`), so it runs the moment it arrives.
(function () {
  var started = new Map();
  function start(url) {
    started.set(url, fetch(url, { headers: { Accept: 'application/json' }, credentials: 'same-origin' }));
  }
  start('/api/me');
  var path = location.pathname;
  var formula = /^\/formulas\/([^/]+)\/?$/.exec(path);
  if (formula) start('/api/formulas/' + formula[1]);
  var plan = /^\/plans\/([^/]+)\/?$/.exec(path);
  if (plan) start('/api/plans/' + plan[1]);
  globalThis.__panformEarly = started;
})();
