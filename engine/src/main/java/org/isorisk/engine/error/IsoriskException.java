package org.isorisk.engine.error;

/** Root of every error isorisk reports to a user; unchecked so that values can validate in constructors. */
public class IsoriskException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public IsoriskException(String message) {
        super(message);
    }

    public IsoriskException(String message, Throwable cause) {
        super(message, cause);
    }
}
