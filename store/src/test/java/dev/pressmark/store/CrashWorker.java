package dev.pressmark.store;

import java.util.SplittableRandom;

/**
 * The child process of the crash trials ({@link CrashTrials}): publishes and activates versions of
 * one model in a loop, rolling back every third step, until it is killed. Prints "ready" once the
 * store is open, then "begin OPERATION" before every operation and one line for every operation
 * that returned, so the parent knows what was committed and what was under way when it killed.
 */
public final class CrashWorker {

    /** Large enough that a kill often lands while a version's pages are being written. */
    static final int WEIGHTS_BYTES = 48 * 1024;

    private CrashWorker() {
    }

    public static void main(String[] args) {
        String url = args[0];
        String model = args[1];
        SplittableRandom random = new SplittableRandom(Long.parseLong(args[2]));
        try (BundleStore store = BundleStore.open(url)) {
            System.out.println("ready");
            System.out.flush();
            for (int i = 0; ; i++) {
                String tag = "v" + i;
                byte[] bundle = bundle(model, random);
                say("begin publish " + tag);
                store.publish(model, tag, bundle, "crash-worker");
                say("published " + tag);
                say("begin activate " + tag);
                store.activate(model, tag, "crash-worker", "");
                say("activated " + tag);
                if (i % 3 == 2) {
                    say("begin rollback");
                    String back = store.rollback(model, "crash-worker").tag();
                    say("rolled-back-to " + back);
                }
            }
        }
    }

    /** One progress line, flushed at once: the parent reads what the child was doing from the last line before the kill. */
    private static void say(String line) {
        System.out.println(line);
        System.out.flush();
    }

    /** A loadable bundle whose weights take about {@link #WEIGHTS_BYTES}: one score of 8-byte weights per feature. */
    private static byte[] bundle(String model, SplittableRandom random) {
        return TestBundles.sized(model, random.nextLong(), TestBundles.FIELDS, TestBundles.LABELS, WEIGHTS_BYTES / 8);
    }
}
