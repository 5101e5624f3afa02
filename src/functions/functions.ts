/**
 * Entry of the custom-functions bundle (dist/functions.js). Each fn-*.ts file holds JSDoc-tagged cell functions;
 * custom-functions-metadata-plugin reads them to write functions.json and appends CustomFunctions.associate
 * calls at build. Nothing here may touch Office, window or document: the bundle must load in a bare context
 * whose only host global is CustomFunctions.
 */
import './fn-correlation';
import './fn-checks';
import './fn-compare';
import './fn-planning';
