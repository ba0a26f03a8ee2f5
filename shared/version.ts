import { version as packageVersion } from '../package.json';

/**
 * Version of the product (the web application, its API and its reports): package.json's
 * "version", the one place it is set. Shown by /api/health and on the calculation package's
 * cover.
 */
export const PRODUCT_VERSION: string = packageVersion;

/** Version of the solver in `shared/`; stored beside every computed result. Raise it when a
 *  change alters any computed number. */
export const SOLVER_VERSION = '1.3.0';
