// ml-regression ships no type declarations; its sub-packages do. Re-export them under the umbrella name.
declare module 'ml-regression' {
  export { SimpleLinearRegression, SimpleLinearRegression as SLR } from 'ml-regression-simple-linear';
  export { PolynomialRegression } from 'ml-regression-polynomial';
  export { default as MultivariateLinearRegression } from 'ml-regression-multivariate-linear';
}
