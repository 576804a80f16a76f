/**
 * Formatting of engine results for people (tables), spreadsheets (CSV) and scripts (JSON, in the shapes of
 * {@link org.isorisk.engine.io.ResultJson}), locale-independent, each ending with the caution. No arithmetic here:
 * every number printed comes from an engine value.
 */
package org.isorisk.cli.render;
