package dev.pressmark.demo;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;

/**
 * Invented listing titles of a fictional hardware marketplace, each with the department it is
 * routed to. Brands are made of syllables, so their subword parts carry signal that whole words
 * do not; some titles carry typing slips. Everything is derived from the seed: the same seed and
 * count give the same titles.
 */
public final class ListingTitles {

    /** One listing: its title and its department. */
    public record Listing(String title, String department) {
    }

    private static final String[] BRAND_STARTS = {"Brass", "Torv", "Kel", "Aqua", "Volt", "Fern", "Iron", "Lumo", "Gripp", "Stav"};
    private static final String[] BRAND_ENDS = {"line", "ik", "mora", "ward", "ex", "holt", "ara", "stead", "vane", "ton"};
    private static final String[][] DEPARTMENTS = {
        {"plumbing", "ball valve", "faucet cartridge", "pipe elbow", "drain trap", "shower head", "supply hose", "shutoff valve"},
        {"electrical", "circuit breaker", "wall outlet", "dimmer switch", "conduit fitting", "junction box", "cable gland"},
        {"garden", "garden hose", "pulse sprinkler", "hand trowel", "raised planter", "pruning shears", "leaf rake"},
        {"fasteners", "hex bolt", "wood screw", "wall anchor", "lock washer", "threaded rod", "cotter pin"},
    };
    private static final String[] SIZES = {"1/2in", "3/4in", "1in", "12mm", "15mm", "22mm", "M6", "M8", "10ft", "25ft"};
    private static final String[] EXTRAS = {"pack of 4", "pack of 10", "stainless", "brushed nickel", "heavy duty", "outdoor", "pro series", "2-pack"};

    private ListingTitles() {
    }

    /** {@code count} listings from {@code seed}. */
    public static List<Listing> generate(int count, long seed) {
        if (count < 0) {
            throw new IllegalArgumentException("count must be >= 0, was " + count);
        }
        SplittableRandom random = new SplittableRandom(seed);
        List<Listing> listings = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            String[] department = DEPARTMENTS[random.nextInt(DEPARTMENTS.length)];
            listings.add(new Listing(title(random, department), department[0]));
        }
        return listings;
    }

    private static String title(SplittableRandom random, String[] department) {
        StringBuilder title = new StringBuilder();
        title.append(BRAND_STARTS[random.nextInt(BRAND_STARTS.length)]).append(BRAND_ENDS[random.nextInt(BRAND_ENDS.length)]);
        String product = department[1 + random.nextInt(department.length - 1)];
        title.append(' ').append(random.nextInt(5) == 0 ? slip(product, random) : product);
        if (random.nextBoolean()) {
            title.append(' ').append(SIZES[random.nextInt(SIZES.length)]);
        }
        if (random.nextInt(3) == 0) {
            title.append(", ").append(EXTRAS[random.nextInt(EXTRAS.length)]);
        }
        if (random.nextInt(4) == 0) {
            title.append(' ').append((char) ('A' + random.nextInt(26))).append((char) ('A' + random.nextInt(26)))
                    .append('-').append(100 + random.nextInt(900));
        }
        return title.toString();
    }

    /** A typing slip: two neighbouring letters swapped, or one dropped. */
    private static String slip(String text, SplittableRandom random) {
        int at = 1 + random.nextInt(text.length() - 2);
        if (text.charAt(at) == ' ' || text.charAt(at + 1) == ' ') {
            return text;
        }
        if (random.nextBoolean()) {
            return text.substring(0, at) + text.charAt(at + 1) + text.charAt(at) + text.substring(at + 2);
        }
        return text.substring(0, at) + text.substring(at + 1);
    }

    /**
     * Prints {@code COUNT} titles (default 20,000), one a line. {@code --with-department} adds a
     * tab and the label; {@code --csv} prints an RFC 4180 file with the header {@code title,department}.
     */
    public static void main(String[] args) throws IOException {
        int count = 20_000;
        boolean withDepartment = false;
        boolean csv = false;
        for (String arg : args) {
            switch (arg) {
                case "--with-department" -> withDepartment = true;
                case "--csv" -> csv = true;
                default -> count = Integer.parseInt(arg);
            }
        }
        Writer out = new BufferedWriter(new OutputStreamWriter(System.out, StandardCharsets.UTF_8));
        if (csv) {
            out.write("title,department\r\n");
        }
        for (Listing listing : generate(count, 7)) {
            if (csv) {
                out.write('"' + listing.title().replace("\"", "\"\"") + "\"," + listing.department() + "\r\n");
                continue;
            }
            out.write(listing.title());
            if (withDepartment) {
                out.write('\t');
                out.write(listing.department());
            }
            out.write('\n');
        }
        out.flush();
    }
}
