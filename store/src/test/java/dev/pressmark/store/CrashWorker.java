package dev.pressmark.store;

import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import dev.pressmark.core.bundle.BundleArchive;
import java.nio.charset.StandardCharsets;
import java.util.LinkedHashMap;
import java.util.Map;
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

    private static byte[] bundle(String model, SplittableRandom random) {
        byte[] weights = new byte[WEIGHTS_BYTES];
        for (int i = 0; i < weights.length; i++) {
            weights[i] = (byte) random.nextInt(256);
        }
        Map<String, byte[]> entries = new LinkedHashMap<>();
        entries.put(BundleArchive.TOKENIZER, ("{\"model\":\"" + model + "\"}").getBytes(StandardCharsets.UTF_8));
        entries.put(BundleArchive.FEATURES, "{}".getBytes(StandardCharsets.UTF_8));
        entries.put(BundleArchive.WEIGHTS, weights);
        entries.put(BundleArchive.PROFILE, "{}".getBytes(StandardCharsets.UTF_8));
        return BundleArchive.toBytes(JsonNodeFactory.instance.objectNode().put("name", model), entries);
    }
}
