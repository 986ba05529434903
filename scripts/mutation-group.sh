#!/usr/bin/env bash
# Mutation testing of one group of engine files (see DEVELOPERS.md, "Mutation testing").
# Usage: bash scripts/mutation-group.sh <group>   (groups below; reports in reports/mutation/<group>.json)
set -euo pipefail
cd "$(dirname "$0")/.."
B=lib/engine/blocks
T=tests/engine/blocks
P=tests/engine/published-checks.test.ts,tests/engine/registry.test.ts,tests/engine/anchors/*.test.ts
case "${1:-}" in
  first-release)
    MUTATE="$B/hillslope-diffusion.ts,$B/hilltop-erosion.ts,$B/transport-capacity.ts,$B/net-change.ts,$B/peclet-number.ts,$B/isostatic-response.ts,$B/denudation-conversion.ts"
    TESTS="$T/hillslope-diffusion.test.ts,$T/hilltop-erosion.test.ts,$T/transport-capacity.test.ts,$T/net-change.test.ts,$T/peclet-number.test.ts,$T/isostatic-response.test.ts,$T/denudation-conversion.test.ts,$P" ;;
  scarp-channel)
    MUTATE="$B/scarp-forward.ts,$B/scarp-age.ts,$B/stream-power.ts,$B/stream-power-shared.ts,$B/steady-state-channel.ts,$B/advective-geotherm.ts"
    TESTS="$T/scarp-forward.test.ts,$T/scarp-age.test.ts,$T/stream-power.test.ts,$T/steady-state-channel.test.ts,$T/advective-geotherm.test.ts,$P" ;;
  tectonic)
    MUTATE="$B/radiogenic-geotherm.ts,$B/strength-envelope.ts,$B/orogen-flux-balance.ts,$B/plate-flexure.ts,$B/cosmogenic-denudation.ts,$B/closure-exhumation.ts"
    TESTS="$T/radiogenic-geotherm.test.ts,$T/strength-envelope.test.ts,$T/orogen-flux-balance.test.ts,$T/plate-flexure.test.ts,$T/cosmogenic-denudation.test.ts,$T/closure-exhumation.test.ts,tests/engine/tectonic-conventions.test.ts,$P" ;;
  orogen-nuclide)
    # A part of the tectonic group that fits a short session.
    MUTATE="$B/orogen-flux-balance.ts,$B/cosmogenic-denudation.ts"
    TESTS="$T/orogen-flux-balance.test.ts,$T/cosmogenic-denudation.test.ts,tests/engine/tectonic-conventions.test.ts,$P" ;;
  geotherm-strength)
    # radiogenic_geotherm and strength_envelope (a part of the tectonic group that fits a short session).
    MUTATE="$B/radiogenic-geotherm.ts,$B/strength-envelope.ts"
    TESTS="$T/radiogenic-geotherm.test.ts,$T/strength-envelope.test.ts,tests/engine/tectonic-conventions.test.ts,$P" ;;
  flexure-closure)
    # plate_flexure and closure_exhumation (the rest of the tectonic group).
    MUTATE="$B/plate-flexure.ts,$B/closure-exhumation.ts"
    TESTS="$T/plate-flexure.test.ts,$T/closure-exhumation.test.ts,tests/engine/tectonic-conventions.test.ts,$P" ;;
  data)
    MUTATE="$B/scarp-fit.ts,$B/profile-evolution*.ts,$B/channel-march.ts,$B/data-shared.ts,lib/engine/numerics/*.ts,lib/engine/numerics.ts"
    TESTS="$T/scarp-fit.test.ts,$T/profile-evolution*.test.ts,$T/channel-march.test.ts,$T/data-blocks-uncertainty.test.ts,tests/engine/numerics.test.ts,tests/engine/demo-data-sheet.test.ts,$P" ;;
  data-channel|data-scarp-fit|data-profile|data-profile-a|data-profile-run)
    # Parts of the data group that fit a short session: each block with its own tests, the shared helpers',
    # uncertainty, cost, numerics and demo tests, and the published and registry checks.
    case "$1" in
      data-channel) MUTATE="$B/channel-march.ts,$B/data-shared.ts,lib/engine/numerics.ts"; OWN="$T/channel-march.test.ts" ;;
      # The solvers (numerics/erf-fit.ts, erf.ts, diffusion-1d.ts) are left out of these two: instrumented, their
      # inner loops make each fit or run tens of times slower (the scarp_fit tests' first run: 143 s, not 2 s).
      data-scarp-fit) MUTATE="$B/scarp-fit.ts"; OWN="$T/scarp-fit.test.ts" ;;
      data-profile) MUTATE="$B/profile-evolution.ts,$B/profile-evolution-cost.ts,$B/profile-evolution-grid.ts,$B/profile-evolution-run.ts"; OWN="$T/profile-evolution*.test.ts" ;;
      # Its two parts (each fits a short session: about 4–5 mutants a minute on a loaded machine): -a the
      # definition, the cost estimate and the grid (steps, resampled data, limits, fixed grids of samples); -run
      # the run itself (input checks, outputs, warnings, series).
      data-profile-a) MUTATE="$B/profile-evolution.ts,$B/profile-evolution-cost.ts,$B/profile-evolution-grid.ts"; OWN="$T/profile-evolution*.test.ts" ;;
      data-profile-run) MUTATE="$B/profile-evolution-run.ts"; OWN="$T/profile-evolution*.test.ts" ;;
    esac
    TESTS="$OWN,$T/data-shared.test.ts,$T/data-blocks-uncertainty.test.ts,tests/engine/cost.test.ts,tests/engine/numerics.test.ts,tests/engine/demo-data-sheet.test.ts,$P" ;;
  uncertainty)
    MUTATE="lib/engine/uncertainty/statistics.ts,lib/engine/uncertainty/distributions.ts,lib/engine/uncertainty/numeric.ts"
    TESTS="tests/engine/uncertainty/*.test.ts,$T/data-blocks-uncertainty.test.ts" ;;
  uncertainty-statistics|uncertainty-distributions)
    # Parts of the uncertainty group that fit a short session, with only the fast unit and reference-case tests
    # (the Monte Carlo sheets of propagation.test.ts take seconds a mutant): a mutant those miss is a survivor here.
    if [ "$1" = uncertainty-statistics ]; then MUTATE="lib/engine/uncertainty/statistics.ts"; else MUTATE="lib/engine/uncertainty/distributions.ts"; fi
    TESTS="tests/engine/uncertainty/statistics.test.ts,tests/engine/uncertainty/distributions.test.ts,tests/engine/uncertainty/stream.test.ts,tests/engine/uncertainty/reference-cases.test.ts" ;;
  uncertainty-numeric)
    # The other part: expressions compiled to functions on SI floats for the samples.
    MUTATE="lib/engine/uncertainty/numeric.ts"
    TESTS="tests/engine/uncertainty/numeric.test.ts,tests/engine/uncertainty/reference-cases.test.ts,tests/engine/uncertainty/stream.test.ts" ;;
  plumbing-units|plumbing-expression|plumbing-expression-a|plumbing-expression-b|plumbing-evaluate|plumbing-evaluate-a|plumbing-evaluate-a1|plumbing-evaluate-a2|plumbing-evaluate-canonical|plumbing-evaluate-document|plumbing-evaluate-graph|plumbing-evaluate-b|plumbing-evaluate-b1|plumbing-evaluate-b2|plumbing-evaluate-prepare|plumbing-evaluate-run|plumbing-evaluate-c)
    # The engine's plumbing (units, the expression language, evaluation), each part with its fast unit tests
    # (the 10,000-expression fuzz test is left out: it takes seconds even uninstrumented).
    E=lib/engine; TE=tests/engine; PR="tests/engine/published-checks.test.ts,tests/engine/registry.test.ts"
    case "$1" in
      plumbing-units)
        MUTATE="$E/units.ts,$E/engine-units.ts,$E/unit-format.ts,$E/temperature.ts,$E/dataset-units.ts"
        TESTS="$TE/units.test.ts,$TE/unit-plumbing.test.ts,$TE/trust/*.test.ts,$TE/dataset-input.test.ts,$TE/expression.test.ts,$TE/document.test.ts,$PR" ;;
      plumbing-expression)
        MUTATE="$E/expression.ts,$E/locked-math.ts,$E/expression-language.ts,$E/natural-input.ts,$E/text.ts,$E/text-words.ts,$E/value-size.ts"
        TESTS="$TE/expression.test.ts,$TE/limits.test.ts,$TE/trust/*.test.ts,$TE/document.test.ts,$TE/units.test.ts,$PR" ;;
      # Its parts (each fits a short session; every evaluation passes through these files, so each mutant runs
      # every test of the list that evaluates: the lists leave out the slow sheet-wide suites, plausibility and
      # published checks). -a: the language and the locked instance; -b: natural input, text, size caps.
      plumbing-expression-a)
        MUTATE="$E/expression.ts,$E/locked-math.ts,$E/expression-language.ts"
        TESTS="$TE/expression.test.ts,$TE/expression-plumbing.test.ts,$TE/limits.test.ts,$TE/trust/natural-input.test.ts,$TE/trust/temperature.test.ts,$TE/document.test.ts,$TE/registry.test.ts" ;;
      plumbing-expression-b)
        MUTATE="$E/natural-input.ts,$E/text.ts,$E/text-words.ts,$E/value-size.ts"
        TESTS="$TE/expression-plumbing.test.ts,$TE/expression.test.ts,$TE/limits.test.ts,$TE/trust/natural-input.test.ts" ;;
      plumbing-evaluate)
        MUTATE="$E/evaluate.ts,$E/results-document.ts,$E/block-evaluation.ts,$E/prepare.ts,$E/block-run.ts,$E/graph.ts,$E/document.ts,$E/canonical-json.ts,$E/cost.ts,$E/errors.ts,$E/dataset-input.ts,$E/dataset.ts,$E/typical-ranges.ts,$E/registry.ts,$E/block-type.ts,$E/index.ts"
        TESTS="$TE/document.test.ts,$TE/graph.test.ts,$TE/incremental.test.ts,$TE/limits.test.ts,$TE/canonical-json.test.ts,$TE/cost.test.ts,$TE/dataset-input.test.ts,$TE/demo-sheets.test.ts,$TE/trust/*.test.ts,$TE/expression.test.ts,$PR" ;;
      # Its parts: -a the document, graph, canonical JSON, errors and dataset references (their own fast tests);
      # -b the evaluation itself (evaluate, prepare, block-run, the public entry points); -c the registry, block-type
      # helpers, typical ranges and the cost estimate.
      plumbing-evaluate-a)
        MUTATE="$E/document.ts,$E/graph.ts,$E/canonical-json.ts,$E/errors.ts,$E/dataset.ts,$E/dataset-input.ts"
        TESTS="$TE/document.test.ts,$TE/graph.test.ts,$TE/canonical-json.test.ts,$TE/dataset-input.test.ts,$TE/evaluate-plumbing.test.ts,$TE/data-reference.test.ts" ;;
      # -a and -b are too large for one short session at about 5 mutants a minute (-a: about 730 runtime
      # mutants, -b: about 790), so each has parts: -a1 errors and data references (about 110), -graph the
      # dependency graph (about 100), -a2 the document and canonical JSON (about 510); -b1 the run, prepare, the
      # results document and the public entry points (about 350), -b2 one block's evaluation and block-run.ts
      # (about 450).
      plumbing-evaluate-a1)
        MUTATE="$E/errors.ts,$E/dataset.ts,$E/dataset-input.ts"
        TESTS="$TE/graph.test.ts,$TE/dataset-input.test.ts,$TE/evaluate-plumbing.test.ts,$TE/data-reference.test.ts" ;;
      plumbing-evaluate-graph)
        MUTATE="$E/graph.ts"
        TESTS="$TE/graph.test.ts,$TE/evaluate-plumbing.test.ts" ;;
      plumbing-evaluate-a2)
        MUTATE="$E/document.ts,$E/canonical-json.ts"
        TESTS="$TE/document.test.ts,$TE/document-checks.test.ts,$TE/canonical-json.test.ts,$TE/evaluate-plumbing.test.ts" ;;
      # -a2's parts: canonical JSON alone (about 130 mutants; without document.test.ts, whose sheet evaluations
      # reach every mutant through the document hash) and the document (about 380).
      plumbing-evaluate-canonical)
        MUTATE="$E/canonical-json.ts"
        TESTS="$TE/canonical-json.test.ts,$TE/evaluate-plumbing.test.ts" ;;
      plumbing-evaluate-document)
        MUTATE="$E/document.ts"
        TESTS="$TE/document.test.ts,$TE/document-checks.test.ts,$TE/canonical-json.test.ts,$TE/evaluate-plumbing.test.ts" ;;
      # -b1's other part is -prepare (prepare.ts and the public entry points, about 210), with -b's test list.
      plumbing-evaluate-b|plumbing-evaluate-b1|plumbing-evaluate-b2|plumbing-evaluate-prepare)
        case "$1" in
          plumbing-evaluate-b) MUTATE="$E/evaluate.ts,$E/results-document.ts,$E/block-evaluation.ts,$E/prepare.ts,$E/block-run.ts,$E/index.ts" ;;
          plumbing-evaluate-b1) MUTATE="$E/evaluate.ts,$E/results-document.ts,$E/prepare.ts,$E/index.ts" ;;
          plumbing-evaluate-b2) MUTATE="$E/block-evaluation.ts,$E/block-run.ts" ;;
          plumbing-evaluate-prepare) MUTATE="$E/prepare.ts,$E/index.ts" ;;
        esac
        TESTS="$TE/document.test.ts,$TE/graph.test.ts,$TE/incremental.test.ts,$TE/limits.test.ts,$TE/dataset-input.test.ts,$TE/demo-sheets.test.ts,$TE/trust/*.test.ts,$TE/expression.test.ts,$TE/evaluate-plumbing.test.ts,$TE/evaluation-run.test.ts,$TE/block-run.test.ts,$TE/prepare.test.ts,$TE/block-evaluation.test.ts,tests/engine/uncertainty/pass-sheets.test.ts,tests/engine/uncertainty/pass-edges.test.ts,tests/engine/uncertainty/pass-linear.test.ts,$PR" ;;
      # A part of -b1 that fits a short session, with the tests aimed at it only (the sheet-wide suites of -b's
      # list reach every one of its mutants): the run and the results document (about 140 mutants).
      plumbing-evaluate-run)
        MUTATE="$E/evaluate.ts,$E/results-document.ts"
        TESTS="$TE/evaluation-run.test.ts,$TE/incremental.test.ts,$TE/limits.test.ts,$TE/graph.test.ts,$TE/dataset-input.test.ts" ;;
      plumbing-evaluate-c)
        MUTATE="$E/cost.ts,$E/typical-ranges.ts,$E/registry.ts,$E/block-type.ts"
        TESTS="$TE/cost.test.ts,$TE/cost-plumbing.test.ts,$TE/trust/plausibility.test.ts,$TE/evaluate-plumbing.test.ts,$PR" ;;
    esac ;;
  uncertainty-pass|uncertainty-pass-propagate|uncertainty-pass-sampling|uncertainty-pass-spread)
    # The pass itself (plan, sampling, spreads, the stream), with the fast tests written for it (a few ms each:
    # 100–1000 samples) and stream.test.ts; the 10 000-sample sheets of reference-cases.test.ts and
    # propagation.test.ts are left out (each covers every mutant of the pass and costs seconds instrumented).
    # Its parts fit a short session: -propagate (propagate.ts, plan.ts), -sampling (sample-block.ts),
    # -spread (spread.ts, stream.ts).
    U=lib/engine/uncertainty
    case "$1" in
      uncertainty-pass) MUTATE="$U/propagate.ts,$U/plan.ts,$U/sample-block.ts,$U/spread.ts,$U/stream.ts" ;;
      uncertainty-pass-propagate) MUTATE="$U/propagate.ts,$U/plan.ts" ;;
      uncertainty-pass-sampling) MUTATE="$U/sample-block.ts" ;;
      uncertainty-pass-spread) MUTATE="$U/spread.ts,$U/stream.ts" ;;
    esac
    TESTS="tests/engine/uncertainty/pass-sheets.test.ts,tests/engine/uncertainty/pass-edges.test.ts,tests/engine/uncertainty/pass-fallback.test.ts,tests/engine/uncertainty/pass-linear.test.ts,tests/engine/uncertainty/pass-results.test.ts,tests/engine/uncertainty/pass-parts.test.ts,tests/engine/uncertainty/stream.test.ts"
    # spread.ts and stream.ts have unit tests of their own: the sheets are left out of that part (a mutant they
    # alone would catch counts as a survivor there).
    if [ "$1" = uncertainty-pass-spread ]; then TESTS="tests/engine/uncertainty/pass-parts.test.ts,tests/engine/uncertainty/stream.test.ts"; fi ;;
  solver-erf|solver-erf-fit|solver-erf-fit-a|solver-erf-fit-p|solver-erf-fit-b|solver-diffusion)
    # The solvers of the data blocks, each with its own fast unit tests (tens of points, a few steps: the block
    # tests of scarp_fit and profile_evolution take minutes a mutant when these inner loops are instrumented).
    N=lib/engine/numerics; TN=tests/engine/numerics
    case "$1" in
      solver-erf) MUTATE="$N/erf.ts"; TESTS="$TN/erf.test.ts,tests/engine/published-checks.test.ts" ;;
      solver-erf-fit) MUTATE="$N/erf-fit.ts"; TESTS="$TN/erf-fit.test.ts" ;;
      # Its parts by lines (each fits a short session): -a the small linear algebra, -p the projection, scan and
      # Jacobian (its loops make every test tens of times slower instrumented), -b the normal equations,
      # Levenberg–Marquardt and the fit itself.
      solver-erf-fit-a) MUTATE="$N/erf-fit.ts:1-97"; TESTS="$TN/erf-fit.test.ts" ;;
      solver-erf-fit-p) MUTATE="$N/erf-fit.ts:98-220"; TESTS="$TN/erf-fit.test.ts" ;;
      solver-erf-fit-b) MUTATE="$N/erf-fit.ts:221-343"; TESTS="$TN/erf-fit.test.ts" ;;
      solver-diffusion) MUTATE="$N/diffusion-1d.ts"; TESTS="$TN/diffusion-1d.test.ts" ;;
    esac ;;
  *) echo "usage: $0 first-release|scarp-channel|tectonic|orogen-nuclide|geotherm-strength|flexure-closure|data|data-channel|data-scarp-fit|data-profile|data-profile-a|data-profile-run|uncertainty|uncertainty-statistics|uncertainty-distributions|uncertainty-numeric|plumbing-units|plumbing-expression|plumbing-expression-a|plumbing-expression-b|plumbing-evaluate|plumbing-evaluate-a|plumbing-evaluate-a1|plumbing-evaluate-a2|plumbing-evaluate-canonical|plumbing-evaluate-document|plumbing-evaluate-graph|plumbing-evaluate-b|plumbing-evaluate-b1|plumbing-evaluate-b2|plumbing-evaluate-prepare|plumbing-evaluate-run|plumbing-evaluate-c|uncertainty-pass|uncertainty-pass-propagate|uncertainty-pass-sampling|uncertainty-pass-spread|solver-erf|solver-erf-fit|solver-erf-fit-a|solver-erf-fit-p|solver-erf-fit-b|solver-diffusion" >&2; exit 2 ;;
esac
export DENUDATA_MUTATION_TESTS="$TESTS" DENUDATA_MUTATION_REPORT="$1"
exec nice -n 15 npx stryker run --incremental --mutate "$MUTATE" ${@:2}
