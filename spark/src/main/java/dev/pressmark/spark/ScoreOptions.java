package dev.pressmark.spark;

import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Objects;

/** {@link ScoreJob}'s command line. */
record ScoreOptions(String model, String store, String input, String output, Format format, Map<String, String> columns,
        int maxTokensPerField) {

    enum Format { PARQUET, CSV }

    ScoreOptions {
        Objects.requireNonNull(model, "model");
        Objects.requireNonNull(store, "store");
        Objects.requireNonNull(input, "input");
        Objects.requireNonNull(output, "output");
        Objects.requireNonNull(format, "format");
        columns = Map.copyOf(columns);
        if (maxTokensPerField < 1) {
            throw new IllegalArgumentException("--max-tokens-per-field must be >= 1 tokens, was " + maxTokensPerField);
        }
    }

    /** Parses {@code args}; {@code storeFromEnv} (may be null) is the store when {@code --store} is not given. */
    static ScoreOptions parse(String[] args, String storeFromEnv) {
        Map<String, String> values = new LinkedHashMap<>();
        Map<String, String> columns = new LinkedHashMap<>();
        for (int i = 0; i < args.length; i += 2) {
            String name = args[i];
            if (i + 1 >= args.length) {
                throw new IllegalArgumentException(name + " needs a value");
            }
            String value = args[i + 1];
            switch (name) {
                case "--model", "--store", "--input", "--output", "--format", "--max-tokens-per-field" -> {
                    if (values.put(name, value) != null) {
                        throw new IllegalArgumentException(name + " is given twice");
                    }
                }
                case "--column" -> column(value, columns);
                default -> throw new IllegalArgumentException("unknown option " + name);
            }
        }
        String store = values.getOrDefault("--store", storeFromEnv);
        return new ScoreOptions(required(values, "--model"), required(store, "--store"), required(values, "--input"),
                required(values, "--output"), format(values.getOrDefault("--format", "parquet")), columns,
                tokens(values.getOrDefault("--max-tokens-per-field", String.valueOf(PressmarkScorer.DEFAULT_MAX_TOKENS_PER_FIELD))));
    }

    private static void column(String value, Map<String, String> columns) {
        int equals = value.indexOf('=');
        if (equals <= 0 || equals == value.length() - 1) {
            throw new IllegalArgumentException("--column takes FIELD=COLUMN, was \"" + value + "\"");
        }
        columns.put(value.substring(0, equals), value.substring(equals + 1));
    }

    private static String required(Map<String, String> values, String name) {
        return required(values.get(name), name);
    }

    private static String required(String value, String name) {
        if (value == null || value.isBlank()) {
            throw new IllegalArgumentException(name + " is required");
        }
        return value;
    }

    private static Format format(String value) {
        return switch (value.toLowerCase(Locale.ROOT)) {
            case "parquet" -> Format.PARQUET;
            case "csv" -> Format.CSV;
            default -> throw new IllegalArgumentException("--format must be parquet or csv, was \"" + value + "\"");
        };
    }

    private static int tokens(String value) {
        try {
            return Integer.parseInt(value);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("--max-tokens-per-field must be a whole number, was \"" + value + "\"", e);
        }
    }
}
