/**
 * Reading and writing files: the YAML mandate policy ({@link org.isorisk.engine.io.PolicyReader}) with its per-asset
 * limits table. Every error names the file, the line (or row) and the key, and says what would fix it.
 */
package org.isorisk.engine.io;
