package dev.pressmark.core.drift;

/**
 * What a drift window saw, against the training profile. With an empty window every live
 * statistic and the status are {@code null}: there is nothing to compare yet.
 *
 * @param windowItems how many items the window holds
 * @param trainingUnknownRate the training rows' share of tokens the model cannot use
 * @param liveUnknownRate the window's share of tokens the model cannot use; {@code null} when empty
 * @param psi the population stability index of the window's token document frequencies against the
 *     training ones (see {@link DriftWindow}); {@code null} when empty
 * @param length tokens per item, live against training; {@code null} when empty
 * @param status what {@code psi} says by the common rule of thumb; {@code null} when empty
 */
public record DriftReport(int windowItems, double trainingUnknownRate, Double liveUnknownRate, Double psi, LengthShift length,
        DriftStatus status) {

    public DriftReport {
        if (windowItems < 0) {
            throw new IllegalArgumentException("windowItems must be >= 0, was " + windowItems);
        }
        boolean empty = windowItems == 0;
        if (empty != (liveUnknownRate == null) || empty != (psi == null) || empty != (length == null) || empty != (status == null)) {
            throw new IllegalArgumentException("the live statistics must be null exactly when the window is empty (" + windowItems + " items)");
        }
    }

    static DriftReport empty(double trainingUnknownRate) {
        return new DriftReport(0, trainingUnknownRate, null, null, null, null);
    }
}
