package dev.pressmark.core.train;

import dev.pressmark.core.PressmarkException;
import dev.pressmark.core.Progress;
import dev.pressmark.core.classify.WarmStart;
import dev.pressmark.core.evaluate.Fold;
import dev.pressmark.core.evaluate.FoldSummary;
import dev.pressmark.core.evaluate.MetricSummary;
import dev.pressmark.core.evaluate.MetricValues;
import dev.pressmark.core.feature.FeatureSpace;
import dev.pressmark.core.feature.SparseMatrix;
import dev.pressmark.core.search.Pick;
import dev.pressmark.core.search.SearchSummary;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Future;

/**
 * Scores every candidate of a search by the run's cross-validation, on the training part only.
 *
 * <p>What candidates share is computed once per fold: candidates with the same tokenizer settings
 * share the vocabulary training (the tokenizers); among those,
 * candidates with the same feature settings share the feature space and both feature matrices;
 * and among those, candidates that differ only in C form a chain solved in increasing C, each fit
 * starting from the previous one's dual solution ({@link WarmStart}). The tasks, one per fold and
 * tokenizer setting, run on
 * {@code evaluation.threads}; each fills only its own cells of the result table and draws its
 * randomness from the fold's seed, so the scores are the same at any thread count.
 */
final class SearchRun {

    /**
     * Memory per character of the training text that one task holds at its peak (tokens, counts,
     * the feature matrices): our rule of thumb from heap profiles of WordPiece runs, generous so
     * that the estimate errs towards refusing early rather than failing late.
     */
    static final long BYTES_PER_TEXT_CHAR = 96;

    /** The scores of all candidates and the chosen one's folds, for its Platt sigmoids and manifest. */
    record Outcome(SearchSummary summary, List<TrainingRun.FoldResult> chosenFolds) {
    }

    /** Candidates sharing a tokenizer setting, by feature setting. */
    private record Group(List<FeatureSetting> settings) {
    }

    /** Candidates sharing a tokenizer and a feature setting ({@code config} is the first of them), in chains along increasing C. */
    private record FeatureSetting(TrainConfig config, List<int[]> chains) {
    }

    private final TrainingRun run;
    private final TrainPlan.Search search;
    private final EvaluationConfig evaluation;
    private final int[] trainRows;
    private final int[] trainLabels;
    private final List<Fold> folds;

    SearchRun(TrainingRun run, TrainPlan.Search search, EvaluationConfig evaluation, int[] trainRows, int[] trainLabels,
            List<Fold> folds) {
        this.run = run;
        this.search = search;
        this.evaluation = evaluation;
        this.trainRows = trainRows;
        this.trainLabels = trainLabels;
        this.folds = folds;
    }

    Outcome run(Progress progress) {
        List<Group> groups = groups();
        int candidates = search.configs().size();
        TrainingRun.FoldResult[][] results = new TrainingRun.FoldResult[candidates][folds.size()];
        int[][] features = new int[candidates][folds.size()];
        int tasks = folds.size() * groups.size();
        int threads = Math.max(1, Math.min(evaluation.effectiveThreads(), tasks));
        checkMemory(threads);
        ExecutorService pool = Workers.pool(threads, "pressmark-search");
        long[] done = {0};
        progress.start(String.format(Locale.ROOT, "search: %d candidates x %d folds", candidates, folds.size()),
                (long) candidates * folds.size());
        try {
            List<Future<Object>> futures = new ArrayList<>(tasks);
            for (int f = 0; f < folds.size(); f++) {
                for (Group group : groups) {
                    int fold = f;
                    futures.add(pool.submit(() -> {
                        runTask(fold, group, results, features, () -> {
                            synchronized (progress) {
                                progress.advance(++done[0]);
                            }
                        });
                        return null;
                    }));
                }
            }
            Workers.await(futures, "the search");
        } finally {
            pool.shutdownNow();
            progress.finish();
        }
        return outcome(results, features);
    }

    /**
     * One fold and one tokenizer setting: train the tokenizers once, fit each feature setting with
     * them, then every classifier chain on its matrix.
     */
    private void runTask(int f, Group group, TrainingRun.FoldResult[][] results, int[][] features, Runnable tick) {
        Fold fold = folds.get(f);
        int[] foldTrain = TrainingRun.select(trainRows, fold.train());
        int[] foldTest = TrainingRun.select(trainRows, fold.test());
        TrainConfig first = group.settings.get(0).config;
        List<String> columns = first.data().text();
        PipelineFitter fitter = new PipelineFitter(first.tokenizers(), first.features(), columns);
        List<String[]> trainTexts = run.rows(foldTrain);
        List<String[]> testTexts = run.rows(foldTest);
        PipelineFitter.Fitted firstFit = fitter.fit(trainTexts, Progress.NONE);
        int[] yTrain = TrainingRun.select(trainLabels, fold.train());
        int[] truth = TrainingRun.select(trainLabels, fold.test());
        double[] trainWeights = run.weightsOf(foldTrain);
        double[] testWeights = run.weightsOf(foldTest);
        long seed = run.foldSeed(fold);
        for (FeatureSetting setting : group.settings) {
            // the first fit's tokenizers, trained once, serve every other feature setting
            PipelineFitter.Fitted fitted = setting == group.settings.get(0) ? firstFit
                    : fitter.withFeatures(firstFit.pipeline(), setting.config.features(), trainTexts);
            SparseMatrix x = fitted.x();
            SparseMatrix xTest = fitted.pipeline().transform(testTexts);
            FeatureSpace space = fitted.pipeline().features();
            for (int[] chain : setting.chains) {
                WarmStart warm = search.settings().warmStart() ? new WarmStart() : null;
                for (int candidate : chain) {
                    ClassifierConfig classifier = search.configs().get(candidate).classifier();
                    TrainingRun.Trained trained = run.train(classifier, x, yTrain, trainWeights, seed, warm);
                    boolean keepValues = fold.repeat() == 0 && classifier.kind() == ClassifierConfig.Kind.LINEAR_SVM
                            && classifier.hasProbabilities();
                    results[candidate][f] = run.foldResult(fold, trained, xTest, truth, testWeights, keepValues);
                    features[candidate][f] = space.featureCount();
                    tick.run();
                }
            }
        }
    }

    /**
     * The candidates grouped by tokenizer setting, then by feature setting, each in order of first
     * appearance, with chains of classifier settings that differ only in C, by increasing C.
     */
    private List<Group> groups() {
        Map<Object, Map<Object, Map<ClassifierConfig, List<Integer>>>> tree = new LinkedHashMap<>();
        Map<Object, TrainConfig> firstOf = new LinkedHashMap<>();
        List<TrainConfig> configs = search.configs();
        for (int i = 0; i < configs.size(); i++) {
            TrainConfig config = configs.get(i);
            Object featureKey = List.of(config.tokenizers(), config.features());
            firstOf.putIfAbsent(featureKey, config);
            tree.computeIfAbsent(config.tokenizers(), k -> new LinkedHashMap<>())
                    .computeIfAbsent(featureKey, k -> new LinkedHashMap<>())
                    .computeIfAbsent(withoutC(config.classifier()), k -> new ArrayList<>()).add(i);
        }
        List<Group> groups = new ArrayList<>();
        tree.forEach((tokenizer, byFeatures) -> {
            List<FeatureSetting> settings = new ArrayList<>();
            byFeatures.forEach((featureKey, chains) -> {
                List<int[]> ordered = new ArrayList<>();
                for (List<Integer> chain : chains.values()) {
                    chain.sort(Comparator.comparingDouble((Integer i) -> configs.get(i).classifier().c()).thenComparingInt(i -> i));
                    ordered.add(chain.stream().mapToInt(Integer::intValue).toArray());
                }
                settings.add(new FeatureSetting(firstOf.get(featureKey), ordered));
            });
            groups.add(new Group(settings));
        });
        return groups;
    }

    private static ClassifierConfig withoutC(ClassifierConfig c) {
        return new ClassifierConfig(c.kind(), 1.0, c.loss(), c.classWeight(), c.probabilities(), c.tolerance(), c.maxIterations());
    }

    private Outcome outcome(TrainingRun.FoldResult[][] results, int[][] features) {
        List<SearchSummary.Scored> scored = new ArrayList<>();
        List<Pick.Scored> forPick = new ArrayList<>();
        for (int i = 0; i < results.length; i++) {
            List<MetricValues> perFold = new ArrayList<>(folds.size());
            for (TrainingRun.FoldResult result : results[i]) {
                perFold.add(result.evaluation().overall());
            }
            MetricSummary summary = FoldSummary.of(perFold).get(search.settings().metric());
            scored.add(new SearchSummary.Scored(search.candidates().get(i).settings(), summary.mean(), summary.standardError()));
            double meanFeatures = 0;
            for (int count : features[i]) {
                meanFeatures += count;
            }
            forPick.add(new Pick.Scored(summary.mean(), summary.standardError(), search.configs().get(i).classifier().c(),
                    meanFeatures / features[i].length));
        }
        int chosen = search.settings().pick().choose(forPick);
        SearchSummary summary = new SearchSummary(search.settings().metric(), search.settings().pick(), scored, chosen);
        return new Outcome(summary, List.of(results[chosen]));
    }

    /** Refuses, before any work, a search whose estimated peak memory exceeds what the JVM can still get. */
    private void checkMemory(int threads) {
        long chars = 0;
        for (String[] row : run.rows(trainRows)) {
            for (String text : row) {
                chars += text.length() + 1;
            }
        }
        long perTask = chars * BYTES_PER_TEXT_CHAR;
        long scores = 0;
        for (TrainConfig config : search.configs()) {
            if (config.classifier().kind() == ClassifierConfig.Kind.LINEAR_SVM && config.classifier().hasProbabilities()) {
                scores += (long) trainRows.length * Math.max(1, run.labels().size() == 2 ? 1 : run.labels().size()) * Double.BYTES;
            }
        }
        Runtime runtime = Runtime.getRuntime();
        long available = runtime.maxMemory() - (runtime.totalMemory() - runtime.freeMemory());
        requireMemory(threads, perTask, scores, available);
    }

    static void requireMemory(int threads, long perTaskBytes, long scoreBytes, long availableBytes) {
        long needed = threads * perTaskBytes + scoreBytes;
        if (needed > availableBytes) {
            throw new PressmarkException("search-too-large", String.format(Locale.ROOT,
                    "the search needs about %,d MiB (%d tasks at once of about %,d MiB each, and %,d MiB of held-out scores),"
                            + " but the JVM can use about %,d MiB more; lower evaluation.threads, shrink search.grid, or raise"
                            + " the heap (-Xmx)",
                    mib(needed), threads, mib(perTaskBytes), mib(scoreBytes), mib(availableBytes)));
        }
    }

    private static long mib(long bytes) {
        return (bytes + (1 << 20) - 1) >> 20;
    }
}
