/** Dense linear algebra for least squares: Householder QR, weighted solve with refinement. */
export { qrFactor, solveR, solveRt, invertR, covarianceFromRinv, type QRFactor, type QRFactorOptions } from "./qr";
export { applyQ, applyQt } from "./applyQ";
export { solveLinearLeastSquares, type LinearLeastSquaresOptions, type LinearLeastSquaresResult } from "./lstsq";
export { ddDot, ddSubtractScaledColumn } from "./dd";
