/**
 * The results store: an index of run folders in a database (SQLite by default, PostgreSQL for
 * several stations), the station file, and the questions asked across runs (lists, trends).
 * The run folders stay the source of truth; the index can always be rebuilt from them.
 */
package org.zweep.runner.store;
