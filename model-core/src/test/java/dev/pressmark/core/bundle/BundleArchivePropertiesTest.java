package dev.pressmark.core.bundle;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Arrays;
import java.util.Map;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;

class BundleArchivePropertiesTest {

    private static final byte[] BUNDLE = TestBundles.bundle(42);
    private static final Map<String, byte[]> ENTRIES = TestBundles.entries(42);

    record Mutation(int position, int value) {
    }

    @Provide
    Arbitrary<Mutation[]> mutations() {
        Arbitrary<Mutation> one = Combinators.combine(Arbitraries.integers().between(0, BUNDLE.length - 1),
                Arbitraries.integers().between(0, 255)).as(Mutation::new);
        return one.array(Mutation[].class).ofMinSize(1).ofMaxSize(4);
    }

    @Property(tries = 2000)
    void random_byte_changes_either_read_back_the_same_content_or_fail_as_a_bundle_error(@ForAll("mutations") Mutation[] mutations) {
        byte[] bundle = BUNDLE.clone();
        for (Mutation m : mutations) {
            bundle[m.position()] = (byte) m.value();
        }
        BundleContents contents;
        try {
            contents = BundleArchive.read(bundle);
        } catch (BundleException expected) {
            assertThat(expected.code()).startsWith("bundle-");
            return;
        }
        assertThat(contents.entries().keySet()).isEqualTo(ENTRIES.keySet());
        for (Map.Entry<String, byte[]> entry : ENTRIES.entrySet()) {
            assertThat(contents.entry(entry.getKey())).isEqualTo(entry.getValue());
        }
    }

    @Property(tries = 300)
    void removing_or_inserting_bytes_fails_as_a_bundle_error(@ForAll("positions") int position, @ForAll boolean insert) {
        byte[] bundle;
        if (insert) {
            bundle = new byte[BUNDLE.length + 1];
            System.arraycopy(BUNDLE, 0, bundle, 0, position);
            bundle[position] = 0x50;
            System.arraycopy(BUNDLE, position, bundle, position + 1, BUNDLE.length - position);
        } else {
            bundle = new byte[BUNDLE.length - 1];
            System.arraycopy(BUNDLE, 0, bundle, 0, position);
            System.arraycopy(BUNDLE, position + 1, bundle, position, BUNDLE.length - position - 1);
        }
        byte[] changed = bundle;
        try {
            BundleArchive.read(changed);
            throw new AssertionError("a bundle with a byte " + (insert ? "inserted" : "removed") + " at " + position + " was accepted: "
                    + Arrays.hashCode(changed));
        } catch (BundleException expected) {
            assertThat(expected.code()).startsWith("bundle-");
        }
    }

    @Provide
    Arbitrary<Integer> positions() {
        return Arbitraries.integers().between(0, BUNDLE.length - 1);
    }
}
