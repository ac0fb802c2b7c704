package dev.pressmark.store.jdbc;

import dev.pressmark.store.BundleStore;
import dev.pressmark.store.StoreException;
import java.lang.reflect.InvocationHandler;
import java.lang.reflect.InvocationTargetException;
import java.lang.reflect.Method;
import java.lang.reflect.Proxy;
import java.util.Objects;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Opens a store for a long-running service ({@code pressmark serve}) so that a database that is down at start-up does
 * not stop the service from starting. A store that answers is returned as it is. A PostgreSQL
 * store that cannot be reached ({@link StoreException#UNREACHABLE}) is returned as a stand-in
 * whose every operation fails with that code, while a thread keeps opening the real one with a
 * doubling delay from {@value #FIRST_RETRY_MS} ms up to {@value #MAX_RETRY_MS} ms; once it opens,
 * every call goes to it. The stand-in logs once when it starts waiting and once when it connects,
 * not on every attempt.
 *
 * <p>Any other failure (a bad URL, a file that is not a store, a schema newer than this program,
 * an SQLite path that cannot be opened) is thrown at once: waiting cannot mend it. An SQLite
 * store is a file on this machine, never "down".
 *
 * <p>The stand-in is a {@link Proxy} over the {@link BundleStore} interface, so that every
 * operation the interface has, now or later, behaves the same way without a list to keep in step.
 */
final class Reconnecting {

    private static final Logger LOG = LoggerFactory.getLogger(Reconnecting.class);
    /** The first delay before trying again. */
    static final long FIRST_RETRY_MS = 250;
    /** The longest delay between two attempts: a store back up is seen within this (plus one connection attempt). */
    static final long MAX_RETRY_MS = 5_000;

    private Reconnecting() {
    }

    /** The store at {@code url}; a stand-in that keeps connecting when it is a PostgreSQL store that is down. */
    static BundleStore open(String url) {
        Objects.requireNonNull(url, "url");
        StoreUrl parsed = StoreUrl.parse(url, System.getenv());
        try {
            return JdbcBundleStore.open(parsed);
        } catch (StoreException e) {
            if (!StoreException.UNREACHABLE.equals(e.code())) {
                throw e;
            }
            LOG.warn("{}; serving without a store and trying again (every {} s at most)", e.getMessage(), MAX_RETRY_MS / 1000);
            Connector connector = new Connector(parsed, e);
            connector.thread.start();
            return (BundleStore) Proxy.newProxyInstance(BundleStore.class.getClassLoader(), new Class<?>[] {BundleStore.class}, connector);
        }
    }

    /** The stand-in's calls and the thread that opens the real store. */
    private static final class Connector implements InvocationHandler {

        private final StoreUrl url;
        private final String description;
        private final Thread thread;
        private final CountDownLatch closed = new CountDownLatch(1);
        private volatile BundleStore store;
        private volatile StoreException lastFailure;

        Connector(StoreUrl url, StoreException firstFailure) {
            this.url = url;
            this.description = url.describe();
            this.lastFailure = firstFailure;
            this.thread = new Thread(this::connect, "pressmark-store-connect");
            this.thread.setDaemon(true);
        }

        private void connect() {
            long delayMs = FIRST_RETRY_MS;
            try {
                while (!closed.await(delayMs, TimeUnit.MILLISECONDS)) {
                    try {
                        BundleStore opened = JdbcBundleStore.open(url);
                        synchronized (this) {
                            if (closed.getCount() == 0) {
                                opened.close();
                                return;
                            }
                            store = opened;
                        }
                        LOG.info("connected to the store {}", description);
                        return;
                    } catch (StoreException e) {
                        if (!e.code().equals(lastFailure.code())) {
                            // a new reason (reachable now but unusable, a newer schema say): worth one line, not one per attempt
                            LOG.warn("the store {} still cannot be used: {}", description, e.getMessage());
                        }
                        lastFailure = e;
                        delayMs = Math.min(MAX_RETRY_MS, delayMs * 2);
                    }
                }
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }

        @Override
        public Object invoke(Object proxy, Method method, Object[] args) throws Throwable {
            switch (method.getName()) {
                case "close" -> {
                    close();
                    return null;
                }
                case "describe" -> {
                    return description;
                }
                case "toString" -> {
                    return description;
                }
                case "hashCode" -> {
                    return System.identityHashCode(proxy);
                }
                case "equals" -> {
                    return proxy == args[0];
                }
                default -> {
                }
            }
            BundleStore current = store;
            if (current == null) {
                StoreException cause = lastFailure;
                throw new StoreException(StoreException.UNREACHABLE, cause.getMessage(), cause);
            }
            try {
                return method.invoke(current, args);
            } catch (InvocationTargetException e) {
                throw e.getCause();
            }
        }

        private void close() {
            BundleStore current;
            synchronized (this) {
                closed.countDown();
                current = store;
            }
            thread.interrupt();
            if (current != null) {
                current.close();
            }
        }
    }
}
