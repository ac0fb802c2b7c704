package dev.pressmark.core.contract;

import java.util.regex.Matcher;
import java.util.regex.Pattern;

/** A {@code MAJOR.MINOR.PATCH} version (Semantic Versioning 2.0.0, without pre-release or build parts). */
public record SemanticVersion(int major, int minor, int patch) implements Comparable<SemanticVersion> {

    /** The contract version of a model's first version. */
    public static final SemanticVersion FIRST = new SemanticVersion(1, 0, 0);

    private static final Pattern FORM = Pattern.compile("(0|[1-9]\\d{0,8})\\.(0|[1-9]\\d{0,8})\\.(0|[1-9]\\d{0,8})");

    public SemanticVersion {
        if (major < 0 || minor < 0 || patch < 0) {
            throw new IllegalArgumentException("major, minor and patch must be >= 0, were " + major + "." + minor + "." + patch);
        }
    }

    public static SemanticVersion parse(String text) {
        Matcher m = FORM.matcher(text == null ? "" : text);
        if (!m.matches()) {
            throw new IllegalArgumentException("a version must be MAJOR.MINOR.PATCH of non-negative integers, was \"" + text + "\"");
        }
        return new SemanticVersion(Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2)), Integer.parseInt(m.group(3)));
    }

    public SemanticVersion nextMajor() {
        return new SemanticVersion(Math.addExact(major, 1), 0, 0);
    }

    public SemanticVersion nextMinor() {
        return new SemanticVersion(major, Math.addExact(minor, 1), 0);
    }

    @Override
    public int compareTo(SemanticVersion other) {
        int c = Integer.compare(major, other.major);
        if (c == 0) {
            c = Integer.compare(minor, other.minor);
        }
        return c != 0 ? c : Integer.compare(patch, other.patch);
    }

    @Override
    public String toString() {
        return major + "." + minor + "." + patch;
    }
}
