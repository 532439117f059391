/**
 * The library entry of modalgate (`import { checkModels } from 'modalgate'`): read Matrix Market
 * matrices and DOF maps, solve the lowest modes, check the models of a config in-process, and
 * format the typed report as JUnit XML, Markdown, HTML, JSON or console text. Results support,
 * never replace, review by a qualified engineer.
 */
export { readMatrixMarket, type MatrixFile, type MatrixReadOptions } from './io/matrix-market-reader.js';
export type { MatrixSummary } from './io/matrix-summary.js';
export { readDofMap } from './io/dof-map-reader.js';
export type { DofMap, Component } from './io/dof-map.js';
export type { SymmetricCsc } from './sparse/csc.js';
export { solveModes } from './eigen/solve-modes.js';
export type { ModesRequest, ModesResult, SturmCheck } from './eigen/modes-types.js';
export { checkModels, type CheckModelsOptions } from './pipeline/check-models.js';
export type { PhaseTimes } from './pipeline/analyze-model.js';
export type { RawConfig, RawModelConfig, RawRuleEntry, RawSeverity, RawBaselineConfig } from './io/config-types.js';
export type { CheckReport, ModelReport, ModelStats, ModeRow, ProblemReport, SolveReport, Verdict } from './pipeline/result-types.js';
export type { RuleResult } from './rules/engine.js';
export { formatJunit } from './report/junit-reporter.js';
export { formatMarkdown, type MarkdownOptions } from './report/markdown.js';
export { formatHtml } from './report/html-reporter.js';
export { formatJson } from './report/json-reporter.js';
export { formatConsole, type ConsoleOptions } from './report/console-reporter.js';
