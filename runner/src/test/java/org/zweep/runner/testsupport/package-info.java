/** Helpers shared by the runner tests. */
package org.zweep.runner.testsupport;
