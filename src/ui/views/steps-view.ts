/**
 * Step-fit view: for one step at a time, the data with the fitted curve, the residuals below, the τ's
 * with 95 % CIs, whether the response settled, and every fit-quality flag.
 */
import { Chart } from 'chart.js';
import type { App } from '../app';
import { fitConfig, residualConfig } from '../charts/configs';
import { pageColors } from '../charts/theme';
import { clear, el } from '../helpers/dom';
import { COMPLIANCE_UNIT, displayUnitOf, fmt, fmtCi, fmtSeconds, isPressureQuantity, RESISTANCE_UNIT } from '../helpers/format';
import type { StepFitView } from '../worker/protocol';
import { button, canvasBox, caution, emptyState, notice, viewHead, warningsList } from './common';

function resultPanel(fv: StepFitView): HTMLElement {
  const fit = fv.fit;
  const unit = displayUnitOf(fv.responseQuantity);
  if (!fit) return el('section', { class: 'panel' }, el('h3', { text: `Step S${fv.stepIndex + 1}` }), notice('bad', fv.error ?? 'No fit.'));
  const tauRows = fit.terms.map((t, k) =>
    el('tr', { 'data-testid': `tau-row-${k}` },
      el('td', { text: `τ${fit.terms.length > 1 ? k + 1 : ''}` }),
      el('td', { class: 'num', 'data-testid': `tau-value-${k}`, 'data-si': String(t.tauS.value), text: fmtSeconds(t.tauS.value, 4) }),
      el('td', { class: 'num', 'data-testid': `tau-ci-${k}`, 'data-lo': String(t.tauS.ci95[0]), 'data-hi': String(t.tauS.ci95[1]), text: `[${fmtSeconds(t.tauS.ci95[0], 3)}, ${fmtSeconds(t.tauS.ci95[1], 3)}]` }),
      el('td', { class: 'num', text: `${fmt(t.amplitude.value * unit.fromSi)} ${unit.label}` }),
    ));
  const settledBadge = el('span', { class: `badge ${fit.settled ? 'ok' : 'warn'}`, 'data-testid': 'settled', text: fit.settled ? 'settled' : 'not settled' });
  const convBadge = el('span', { class: `badge ${fit.converged ? 'ok' : 'bad'}`, text: fit.converged ? 'converged' : 'not converged' });
  return el('section', { class: 'panel', 'aria-label': `Fit results of step S${fv.stepIndex + 1}`, 'data-testid': 'fit-results' },
    el('h3', {}, `Step S${fv.stepIndex + 1} at ${fmt(fv.onsetS, 6)} s `, convBadge, ' ', settledBadge),
    el('table', {},
      el('thead', {}, el('tr', {}, el('th', { text: 'Term' }), el('th', { class: 'num', text: 'τ' }), el('th', { class: 'num', text: '95 % CI' }), el('th', { class: 'num', text: 'Amplitude' }))),
      el('tbody', {}, ...tauRows)),
    el('dl', { class: 'kv' },
      el('dt', { text: 'Final value y∞' }), el('dd', { text: fmtCi(fit.yInf.value, fit.yInf.ci95, unit, 4) }),
      ...(fit.deadTimeS ? [el('dt', { text: 'Dead time' }), el('dd', { text: `${fmtSeconds(fit.deadTimeS.value)} [${fmtSeconds(fit.deadTimeS.ci95[0])}, ${fmtSeconds(fit.deadTimeS.ci95[1])}]` })] : []),
      ...(fit.driftPerS ? [el('dt', { text: 'Drift' }), el('dd', { text: `${fmt(fit.driftPerS.value * unit.fromSi)} ${unit.label}/s` })] : []),
      el('dt', { text: 't63 / t95 / t99' }), el('dd', { text: `${fmtSeconds(fit.t63S)} / ${fmtSeconds(fit.t95S)} / ${fmtSeconds(fit.t99S)}` }),
      el('dt', { text: 'Window' }), el('dd', { text: `${fmt(fit.windowInTaus, 3)} × slowest τ${fit.settled ? '' : ' (< 5: plateau extrapolated)'}` }),
      el('dt', { text: 'RMSE / R²' }), el('dd', { text: `${fmt(fit.rmse * unit.fromSi)} ${unit.label} / ${fmt(fit.r2, 5)}` }),
      el('dt', { text: 'Noise σ' }), el('dd', { text: `${fmt(fit.noiseSigma * unit.fromSi)} ${unit.label}` }),
      el('dt', { text: 'Residuals' }), el('dd', { text: `lag-1 r = ${fmt(fit.residualLag1, 2)}, runs z = ${fmt(fit.runsZ, 2)}` }),
      el('dt', { text: 'Optimiser' }), el('dd', { text: `${fit.iterations} iterations; ${fit.stopReason}` }),
      el('dt', { text: 'Points' }), el('dd', { text: `${fit.n} (dof ${fit.dof})` }),
      el('dt', { text: 'Model' }), el('dd', { text: `${fit.model.terms} term(s)${fit.orderSelection ? ' chosen by BIC' : ''}${fit.model.deadTime ? ', dead time' : ''}${fit.model.drift ? ', drift' : ''}${fit.model.robust !== 'none' ? `, ${fit.model.robust} loss` : ''}` }),
    ),
    fv.resistancePaSPerM3 || fv.complianceM3PerPa
      ? el('dl', { class: 'kv', 'data-testid': 'step-physics' },
          ...(fv.resistancePaSPerM3 ? [el('dt', { text: 'Resistance R' }), el('dd', { text: fmtCi(fv.resistancePaSPerM3.value, fv.resistancePaSPerM3.ci95, RESISTANCE_UNIT) })] : []),
          ...(fv.complianceM3PerPa ? [el('dt', { text: 'Compliance C' }), el('dd', { text: `${fmtCi(fv.complianceM3PerPa.value, fv.complianceM3PerPa.ci95, COMPLIANCE_UNIT)}${fv.complianceM3PerPa.inconclusive ? ' (inconclusive)' : ''}` })] : []),
          ...(fv.pressureAbsPa !== null ? [el('dt', { text: 'Node p_abs' }), el('dd', { text: `${fmt(fv.pressureAbsPa / 100, 5)} mbar` })] : []),
        )
      : null,
    fit.flags.length ? el('div', {}, el('h3', { text: `Fit-quality flags (${fit.flags.length})` }), el('ul', { class: 'warn-list', 'data-testid': 'fit-flags' }, ...fit.flags.map((f) => el('li', {}, el('span', { class: 'badge warn', text: f.code }), ' ', f.message)))) : el('p', { class: 'small muted', text: 'No fit-quality flags.' }),
    fit.orderSelection ? el('details', {}, el('summary', { text: 'Model order (BIC, F-test)' }), el('table', {},
      el('thead', {}, el('tr', {}, ...['Terms', 'BIC', 'AICc', 'F-test p', 'Usable'].map((h) => el('th', { text: h })))),
      el('tbody', {}, ...fit.orderSelection.candidates.map((c) => el('tr', {}, el('td', { text: String(c.terms) + (c.terms === fit.orderSelection?.chosenTerms ? ' ✓' : '') }), el('td', { class: 'num', text: fmt(c.bic, 6) }), el('td', { class: 'num', text: fmt(c.aicc, 6) }), el('td', { class: 'num', text: c.fTestP === null ? '—' : fmt(c.fTestP, 3) }), el('td', { text: c.acceptable ? 'yes' : Number.isNaN(c.bic) ? 'not fitted' : 'no' }))))),
      fit.orderSelection.screenedOut ? el('p', { class: 'small muted', text: `Higher orders not fitted: ${fit.orderSelection.screenedOut}` }) : null) : null,
    warningsList(fv.warnings.filter((w) => !fit.flags.some((f) => w.code === f.code))),
    fv.notes.length ? el('ul', { class: 'warn-list muted' }, ...fv.notes.map((n) => el('li', { text: n }))) : null,
  );
}

/** The fit model for every step: number of terms (or automatic by BIC), dead time, drift, robust loss. */
function fitSettings(app: App): HTMLElement {
  const f = app.state.fit;
  const terms = el('select', { 'aria-label': 'Exponential terms', 'data-testid': 'fit-terms' });
  for (const [v, t] of [['auto', 'auto (BIC)'], ['1', '1'], ['2', '2'], ['3', '3']] as const) terms.append(el('option', { value: v, text: t, selected: String(f.terms) === v }));
  const robust = el('select', { 'aria-label': 'Robust loss' });
  for (const [v, t] of [['none', 'least squares'], ['huber', 'Huber'], ['tukey', 'Tukey']] as const) robust.append(el('option', { value: v, text: t, selected: f.robust === v }));
  const dead = el('input', { type: 'checkbox', id: 'fit-dead', checked: f.deadTime });
  const drift = el('input', { type: 'checkbox', id: 'fit-drift', checked: f.drift });
  const apply = (): void => {
    app.state.fit = { terms: terms.value === 'auto' ? 'auto' : (Number(terms.value) as 1 | 2 | 3), deadTime: dead.checked, drift: drift.checked, robust: robust.value as 'none' | 'huber' | 'tukey' };
    void app.analyzeNow();
  };
  for (const c of [terms, robust, dead, drift]) c.addEventListener('change', apply);
  return el('div', { class: 'inline fit-settings', role: 'group', 'aria-label': 'Fit model' },
    el('label', { class: 'inline small' }, 'Terms', terms),
    el('label', { class: 'inline small', for: 'fit-dead' }, dead, 'dead time'),
    el('label', { class: 'inline small', for: 'fit-drift' }, drift, 'drift'),
    el('label', { class: 'inline small' }, 'Loss', robust));
}

export function renderStepsView(app: App, root: HTMLElement): void {
  clear(root);
  const s = app.state;
  root.append(viewHead('h-steps', 'Step fits', 'Each step window with its fitted exponential response and the residuals. τ with 95 % confidence intervals.'));
  const a = s.analysis;
  if (!a) {
    root.append(s.analyzing ? notice('info', 'Fitting…') : emptyState('No fits yet', s.recording ? 'There are no steps to fit: add one in Recording & steps.' : 'Open a log first.', button('Recording & steps', () => app.show('recording'), 'btn')));
    return;
  }
  const idx = Math.min(s.fitStep, a.fits.length - 1);
  const tabs = el('div', { class: 'step-tabs', role: 'tablist', 'aria-label': 'Step' });
  a.fits.forEach((f, i) => {
    const tau = f.fit?.terms.at(-1)?.tauS.value;
    const t = el('button', { type: 'button', class: 'step-tab', role: 'tab', 'aria-selected': String(i === idx), 'data-testid': `step-tab-${i}`, tabindex: i === idx ? '0' : '-1' },
      `S${i + 1}${tau !== undefined ? ` · τ ${fmtSeconds(tau, 3)}` : ' · no fit'}`);
    t.addEventListener('click', () => {
      s.fitStep = i;
      app.render();
    });
    t.addEventListener('keydown', (e) => {
      if (e.key !== 'ArrowRight' && e.key !== 'ArrowLeft') return;
      e.preventDefault();
      s.fitStep = Math.max(0, Math.min(a.fits.length - 1, i + (e.key === 'ArrowRight' ? 1 : -1)));
      app.render();
      (document.querySelector(`[data-testid="step-tab-${s.fitStep}"]`) as HTMLElement | null)?.focus();
    });
    tabs.append(t);
  });
  root.append(el('div', { class: 'panel step-head' }, tabs, fitSettings(app)));
  const fv = a.fits[idx];
  if (!fv) return;
  const top = canvasBox('mid', `Step S${idx + 1}: data and fitted curve`, 'fit-chart');
  const bottom = canvasBox('short', `Step S${idx + 1}: residuals`, 'residual-chart');
  root.append(el('div', { class: 'grid-side' },
    el('section', { class: 'panel', 'aria-label': 'Fit charts' }, top.box, bottom.box),
    resultPanel(fv)));
  if (isPressureQuantity(fv.responseQuantity) || a.fits.some((f) => isPressureQuantity(f.responseQuantity))) root.append(caution());
  if (a.warnings.length) root.append(el('details', { class: 'panel' }, el('summary', { text: `Analysis warnings (${a.warnings.length})` }), warningsList(a.warnings)));
  const colors = pageColors();
  app.keepCharts('steps', [new Chart(top.canvas, fitConfig(fv, colors, true)), ...(fv.fit ? [new Chart(bottom.canvas, residualConfig(fv, colors, true))] : [])]);
}
