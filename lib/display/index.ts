/**
 * lib/display: what people read. One vocabulary (names and symbols of quantities, parameters,
 * models, step kinds, states, actions), symbol typesetting (markup → HTML, SVG, PDF, Unicode),
 * and the one number rule (value(σ), × 10ⁿ, units with superscripts, UTC minutes). Pure: no
 * React, no server, no I/O.
 */
export { runs, plainSymbol, htmlSymbol, escapeHtml, hasMarkup, unicodeShift, type Run, type Shift } from "./typeset";
export { formatNumber, formatValue, formatUnit, formatQuantity, formatTime, formatCount, formatRange, cleanText } from "./numbers";
export {
  QUANTITIES, PARAMETERS, MODEL_LABELS, STEP_KINDS, REVISION_STATES, REVIEW_ACTIONS, ACTIVITY_ACTIONS,
  term, symbolOf, plainSymbolOf, modelLabel, stepKindLabel, stepName, stateLabel, reviewActionLabel, activityLabel, configPathLabel, stepRefLabel, CONFIG_FIELDS, type Term,
} from "./vocabulary";
