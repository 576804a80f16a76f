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
    private transient Configuration conf;

    /**
     * @param path a path or URI, as the user wrote it
     * @param conf the Hadoop configuration to open it with (not modified)
     */
    public HadoopFile(String path, Configuration conf) {
        this.path = path;
        this.conf = conf;
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
        Path p = new Path(path);
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
            return new HadoopFile(relative, conf);
        }
        int s = path.lastIndexOf('/');
        return new HadoopFile(s < 0 ? relative : path.substring(0, s + 1) + relative, conf);
    }

    @Override
    public OptionalLong size() {
        try {
            Path p = new Path(path);
            return OptionalLong.of(p.getFileSystem(conf).getFileStatus(p).getLen());
        } catch (IOException e) {
            return OptionalLong.empty();
        }
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
