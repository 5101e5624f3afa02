/**
 * Property tests run from one fixed seed so that CI is repeatable: a failure seen once is seen every time, and a
 * clean clone gives the same verdict as the machine that committed. To explore new cases locally, set
 * COVARY_FC_SEED to a number, or to "random" for fast-check's own choice.
 */
const fc = require('fast-check');
const wanted = process.env.COVARY_FC_SEED;
if (wanted !== 'random') {
  const seed = wanted !== undefined && wanted !== '' ? Number(wanted) : 20261202;
  fc.configureGlobal({ ...fc.readConfigureGlobal(), seed });
}
