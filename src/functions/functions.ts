/**
 * Entry of the custom-functions bundle (dist/functions.js), and the one list of its modules: each fn-*.ts file
 * imported below holds JSDoc-tagged cell functions; webpack.config.js hands this same list to
 * custom-functions-metadata-plugin, which writes functions.json from them and appends CustomFunctions.associate
 * calls at build. A new module is registered by adding its import here, one per line. Nothing here may touch
 * Office, window or document: the bundle must load in a bare context whose only host global is CustomFunctions.
 */
import './fn-correlation';
import './fn-checks';
import './fn-compare';
import './fn-planning';
import './fn-evidence';
import './fn-residuals';
