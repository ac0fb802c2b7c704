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
 * routed to. Everything is derived from the seed: the same seed and count give the same titles.
 *
 * <p>The data is made so that subwords carry signal that whole words cannot:
 *
 * <ul>
 *   <li>the first word of every title is a brand built from three syllables; the first syllable
 *       usually belongs to the department's own set, and the three together are so many that most
 *       brands occur once or twice, so a held-out part is full of brands its training part never
 *       saw, while their first syllable is familiar;
 *   <li>a large share of titles name a part every department sells (a mounting bracket, a service
 *       kit), so for them the brand is the only clue;
 *   <li>some product names carry a typing slip (two letters swapped, or one dropped).
 * </ul>
 */
public final class ListingTitles {

    /** One listing: its title (the brand is its first word) and its department. */
    public record Listing(String title, String department) {
    }

    /** The share of titles whose product is one every department sells. */
    static final double GENERIC_SHARE = 0.4;
    /** The share of brands that start with a syllable of their own department's set. */
    static final double OWN_ROOT_SHARE = 0.9;
    /** The share of specific product names with a typing slip. */
    static final double SLIP_SHARE = 0.2;

    /** The departments, each followed by the products only it sells. */
    private static final String[][] DEPARTMENTS = {
        {"plumbing", "ball valve", "faucet cartridge", "pipe elbow", "drain trap", "shower head", "supply hose", "shutoff valve"},
        {"electrical", "circuit breaker", "wall outlet", "dimmer switch", "conduit fitting", "junction box", "cable gland"},
        {"garden", "garden hose", "pulse sprinkler", "hand trowel", "raised planter", "pruning shears", "leaf rake"},
        {"fasteners", "hex bolt", "wood screw", "wall anchor", "lock washer", "threaded rod", "cotter pin"},
    };
    /** Brand first syllables, one set per department in the order above. */
    private static final String[][] BRAND_ROOTS = {
        {"Quor", "Vash", "Brel", "Nimo", "Pell", "Druv", "Osk", "Thal"},
        {"Zent", "Kalv", "Ryx", "Voss", "Jor", "Plek", "Ixa", "Mav"},
        {"Fenn", "Loam", "Tir", "Wyl", "Sorr", "Gael", "Ulm", "Bryn"},
        {"Krag", "Stob", "Hux", "Dorn", "Zell", "Grom", "Yat", "Cruv"},
    };
    private static final String[] BRAND_MIDDLES = {"a", "e", "i", "o", "u", "ar", "en", "il", "or", "um", "ay", "ev", "in", "ol", "ur",
        "ad", "et", "is", "om", "ys", "ab", "ek", "id", "op", "ut", "az", "eg", "ip", "ob", "uv"};
    private static final String[] BRAND_ENDS = {"line", "ik", "mora", "ward", "ex", "holt", "ara", "stead", "vane", "ton", "dell", "ix",
        "ona", "ford", "is", "by", "ant", "ette", "gard", "um", "ley", "ock", "ade", "ino", "ry", "wick", "mont", "eau", "oss", "ahl"};
    private static final String[] GENERIC = {"mounting bracket", "service kit", "replacement part", "storage case", "adapter set",
        "spare seal", "universal clip", "starter bundle"};
    private static final String[] SIZES = {"1/2in", "3/4in", "1in", "12mm", "15mm", "22mm", "M6", "M8", "10ft", "25ft"};
    private static final String[] EXTRAS = {"pack of 4", "pack of 10", "stainless", "brushed nickel", "heavy duty", "outdoor", "pro series", "2-pack"};

    private ListingTitles() {
    }

    /** The departments, in a fixed order. */
    public static List<String> departments() {
        List<String> names = new ArrayList<>(DEPARTMENTS.length);
        for (String[] department : DEPARTMENTS) {
            names.add(department[0]);
        }
        return List.copyOf(names);
    }

    /** The first syllables of the brands that usually go with {@code department}. */
    static List<String> brandRoots(String department) {
        return List.of(BRAND_ROOTS[departments().indexOf(department)]);
    }

    /** The products only {@code department} sells. */
    static List<String> products(String department) {
        String[] row = DEPARTMENTS[departments().indexOf(department)];
        return List.of(row).subList(1, row.length);
    }

    /** The products every department sells. */
    static List<String> genericProducts() {
        return List.of(GENERIC);
    }

    /** Every product name as written without a slip, the ones all departments sell included. */
    static List<String> productNames() {
        List<String> names = new ArrayList<>(List.of(GENERIC));
        for (String[] department : DEPARTMENTS) {
            names.addAll(List.of(department).subList(1, department.length));
        }
        return List.copyOf(names);
    }

    /** {@code count} listings from {@code seed}. */
    public static List<Listing> generate(int count, long seed) {
        if (count < 0) {
            throw new IllegalArgumentException("count must be >= 0, was " + count);
        }
        SplittableRandom random = new SplittableRandom(seed);
        List<Listing> listings = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            int department = random.nextInt(DEPARTMENTS.length);
            listings.add(new Listing(title(random, department), DEPARTMENTS[department][0]));
        }
        return listings;
    }

    private static String title(SplittableRandom random, int department) {
        StringBuilder title = new StringBuilder(brand(random, department));
        String[] products = DEPARTMENTS[department];
        if (random.nextDouble() < GENERIC_SHARE) {
            title.append(' ').append(GENERIC[random.nextInt(GENERIC.length)]);
        } else {
            String product = products[1 + random.nextInt(products.length - 1)];
            title.append(' ').append(random.nextDouble() < SLIP_SHARE ? slip(product, random) : product);
        }
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

    private static String brand(SplittableRandom random, int department) {
        int rootSet = random.nextDouble() < OWN_ROOT_SHARE ? department : random.nextInt(BRAND_ROOTS.length);
        String[] roots = BRAND_ROOTS[rootSet];
        return roots[random.nextInt(roots.length)] + BRAND_MIDDLES[random.nextInt(BRAND_MIDDLES.length)]
                + BRAND_ENDS[random.nextInt(BRAND_ENDS.length)];
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

    /** The listings as an RFC 4180 CSV file with the header {@code title,department}. */
    public static void writeCsv(List<Listing> listings, Writer out) throws IOException {
        out.write("title,department\r\n");
        for (Listing listing : listings) {
            out.write('"' + listing.title().replace("\"", "\"\"") + "\"," + listing.department() + "\r\n");
        }
        out.flush();
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
        List<Listing> listings = generate(count, 7);
        if (csv) {
            writeCsv(listings, out);
            return;
        }
        for (Listing listing : listings) {
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
