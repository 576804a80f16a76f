package org.isorisk.spark;

import java.io.FileNotFoundException;
import java.io.IOException;
import java.io.InputStream;
import java.io.ObjectInputStream;
import java.io.ObjectOutputStream;
import java.io.Serializable;
import java.util.OptionalLong;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.Path;
import org.isorisk.engine.io.InputFile;

/**
 * A file on a Hadoop file system (a local path, {@code hdfs://}, an object store such as {@code s3a://} when its
 * connector is on the class path), as the engine's readers take it. Its name in messages is the path as the user
 * wrote it, and a path it names is resolved as the in-process engine resolves a local one (the folder of this file
 * and the relative path joined by {@code /}), so that both engines word their errors alike. Serializable with its
 * Hadoop configuration, so that executors open files the way the driver does.
 */
public final class HadoopFile implements InputFile, Serializable {
    private static final long serialVersionUID = 1L;

    private final String path;
    private final String location;
    private transient Configuration conf;

    /**
     * A file opened where its path says, from the current process's point of view (on the driver: a relative path
     * is relative to the driver's working folder).
     *
     * @param path a path or URI, as the user wrote it
     * @param conf the Hadoop configuration to open it with (not modified)
     */
    public HadoopFile(String path, Configuration conf) {
        this(path, path, conf);
    }

    /**
     * @param path     the name errors give, as the user wrote it
     * @param location where to open it: a fully qualified URI, so that an executor in another working folder (or on
     *                 another machine, for a shared file system) opens the same file
     */
    HadoopFile(String path, String location, Configuration conf) {
        this.path = path;
        this.location = location;
        this.conf = conf;
    }

    /** The file at {@code path} qualified on this process's file system (its scheme, authority, working folder). */
    static HadoopFile qualified(String path, Configuration conf) {
        try {
            Path p = new Path(path);
            return new HadoopFile(path, p.getFileSystem(conf).makeQualified(p).toString(), conf);
        } catch (IOException e) {
            return new HadoopFile(path, conf);
        }
    }

    @Override
    public String path() {
        return path;
    }

    @Override
    public String name() {
        int s = path.lastIndexOf('/');
        return s < 0 ? path : path.substring(s + 1);
    }

    @Override
    public InputStream open() throws IOException {
        Path p = new Path(location);
        FileSystem fs = p.getFileSystem(conf);
        if (!fs.exists(p)) {
            throw new FileNotFoundException(path);
        }
        if (fs.getFileStatus(p).isDirectory()) {
            throw new IOException("it is a folder, not a file");
        }
        return fs.open(p);
    }

    @Override
    public InputFile resolve(String relative) {
        if (relative.startsWith("/") || relative.matches("^[A-Za-z][A-Za-z0-9+.-]*://.*")) {
            return new HadoopFile(relative, relative, conf);
        }
        int s = path.lastIndexOf('/');
        String shown = s < 0 ? relative : path.substring(0, s + 1) + relative;
        return new HadoopFile(shown, new Path(new Path(location).getParent(), relative).toString(), conf);
    }

    @Override
    public OptionalLong size() {
        try {
            Path p = new Path(location);
            return OptionalLong.of(p.getFileSystem(conf).getFileStatus(p).getLen());
        } catch (IOException e) {
            return OptionalLong.empty();
        }
    }

    /** Where the file is opened: a fully qualified URI when made by {@link #qualified}. */
    String location() {
        return location;
    }

    @Override
    public String toString() {
        return path;
    }

    private void writeObject(ObjectOutputStream out) throws IOException {
        out.defaultWriteObject();
        conf.write(out);
    }

    private void readObject(ObjectInputStream in) throws IOException, ClassNotFoundException {
        in.defaultReadObject();
        conf = new Configuration(false);
        conf.readFields(in);
    }
}
