import { createHash } from 'node:crypto';

/**
 * The page's only script: the run/detector picker of the spectra section. Without it (scripts
 * off, or printing) every embedded spectrum shows as a small multiple; with it, the picker
 * appears and shows the chosen run and detector ("all" keeps small multiples). A link to
 * `#spectrum-<run>-<detector>` selects that spectrum. It reads only data-* attributes the
 * page set and changes only `hidden` flags and the picker's values.
 */
export const PICKER_SCRIPT = `(function () {
  var root = document.getElementById('spectra-figures');
  var form = document.getElementById('spectrum-picker');
  if (!root || !form) return;
  var runSel = document.getElementById('pick-run');
  var detSel = document.getElementById('pick-detector');
  var none = document.getElementById('spectrum-none');
  var figs = Array.prototype.slice.call(root.querySelectorAll('figure.spectrum'));
  function show() {
    var r = runSel.value, d = detSel.value, n = 0;
    figs.forEach(function (f) {
      var on = (r === '*' || f.getAttribute('data-run') === r) && (d === '*' || f.getAttribute('data-detector') === d);
      f.hidden = !on;
      if (on) n++;
    });
    none.hidden = n > 0;
  }
  function fromHash() {
    var id = decodeURIComponent(location.hash.slice(1));
    var f = id ? document.getElementById(id) : null;
    if (!f || figs.indexOf(f) < 0) return;
    runSel.value = f.getAttribute('data-run');
    detSel.value = f.getAttribute('data-detector');
    show();
  }
  runSel.addEventListener('change', show);
  detSel.addEventListener('change', show);
  window.addEventListener('hashchange', fromHash);
  form.hidden = false;
  if (figs.length) { runSel.value = figs[0].getAttribute('data-run'); detSel.value = figs[0].getAttribute('data-detector'); }
  show();
  fromHash();
})();`;

/** CSP source for the script above ('sha256-…'), so the page runs it and nothing else. */
export const PICKER_SCRIPT_HASH = `'sha256-${createHash('sha256').update(PICKER_SCRIPT, 'utf8').digest('base64')}'`;
