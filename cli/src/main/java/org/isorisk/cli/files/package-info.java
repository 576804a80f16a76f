/**
 * Files the command line writes: the output folder of a book run ({@link org.isorisk.cli.files.BatchFolder}),
 * committed chunk by chunk so that a run stopped by a crash or Ctrl-C resumes after its last complete chunk.
 */
package org.isorisk.cli.files;
