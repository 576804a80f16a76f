/**
 * The pack folder on disk: the one place that chooses paths, writes files into a temporary sibling, adds the
 * manifest with SHA-256 hashes, and renames the folder into place atomically
 * ({@link org.isorisk.notebooks.folder.PackFolder}).
 */
package org.isorisk.notebooks.folder;
