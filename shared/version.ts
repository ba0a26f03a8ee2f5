/** Version of the solver in `shared/`; stored beside every computed result. Raise it when a
 *  change alters any computed number. */
export const SOLVER_VERSION = '1.2.0';
