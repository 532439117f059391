/** Dense kernels for projected eigenproblems and thin blocks (column-major Float64Array). */
export { symmetricEigen, symmetricEigenvalues, type SymmetricEigenResult } from './symmetric-eigen.js';
export {
  generalizedSymmetricEigen,
  type GeneralizedEigenOptions,
  type GeneralizedMethod,
} from './generalized-eigen.js';
export {
  jacobiGeneralizedEigen,
  type JacobiGeneralizedOptions,
  type JacobiGeneralizedResult,
} from './jacobi-generalized.js';
export { tridiagonalize, applyReductionQ, type Tridiagonal } from './tridiagonalize.js';
export { symmetricEigenRange } from './selected-eigen.js';
export {
  bandedEigen,
  bandEigenvalues,
  tridiagonalEigen,
  type SelectedEigenResult,
} from './banded-eigen.js';
export { bandToTridiagonal } from './band-to-tridiagonal.js';
export { bandEigenvectors } from './band-inverse-iteration.js';
export {
  bandFromDense,
  bandFromTridiagonal,
  bandwidthOf,
  bandNormInf,
  type SymmetricBand,
} from './symmetric-band.js';
export { tridiagonalQr, tridiagonalEigenvalues } from './tridiagonal-qr.js';
export {
  cholesky,
  choleskyOrThrow,
  NotPositiveDefiniteError,
  solveLower,
  solveLowerTransposed,
  solveRightLowerTransposed,
  type CholeskyResult,
} from './cholesky.js';
export { choleskyOrthonormalize, type CholeskyQrResult } from './cholesky-qr.js';
export { svqbOrthonormalize, type SvqbResult } from './svqb.js';
export {
  householderQr,
  thinQr,
  formThinQ,
  upperFactor,
  applyQ,
  applyQTransposed,
  type HouseholderQr,
  type ThinQr,
} from './householder-qr.js';
export {
  transposeTimes,
  gram,
  timesSmall,
  addTimesSmall,
  axpy,
  columnNorms,
  scaleColumns,
  copyColumns,
} from './block-ops.js';
