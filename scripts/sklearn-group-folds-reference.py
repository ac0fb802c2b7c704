#!/usr/bin/python3
"""Writes generated labels and groups and the class balance of scikit-learn's StratifiedGroupKFold
on each, the reference for GroupedFoldsReferenceTest.

    /usr/bin/python3 scripts/sklearn-group-folds-reference.py \
        > model-core/src/test/resources/reference/sklearn-group-folds.json

scikit-learn 1.2.1 from Debian's python3-sklearn (apt-get install python3-sklearn). The balance
figure of a set of folds is the mean over the folds of the largest absolute difference, over the
classes, between a class's share of the fold and its share of all rows (0 = perfectly stratified).

Three figures per data set, each the mean over random_state / permutation seeds 0..9 where random:
- "shuffle": StratifiedGroupKFold(shuffle=True, random_state=s). In 1.2.1 this shuffles the class
  counts of the groups but not their ids, so the greedy places counts of one group under the name
  of another and the folds are grouped but not stratified (scikit-learn issue #32478, fixed by
  pull request #32540 in 2025). Recorded because it is what 1.2.1 does.
- "no_shuffle": shuffle=False, the greedy as intended (deterministic).
- "fixed_shuffle": the greedy with the fix's effect: the groups renamed by a seeded random
  permutation, then shuffle=False, so that the random order only breaks ties of the sort.
"""
import json
import sys

import numpy as np
import sklearn
from sklearn.model_selection import StratifiedGroupKFold

SEEDS = range(10)


def balance(y, folds, k):
    overall = np.bincount(y, minlength=k) / len(y)
    worst = []
    for test in folds:
        share = np.bincount(y[test], minlength=k) / len(test)
        worst.append(np.max(np.abs(share - overall)))
    return float(np.mean(worst))


def figure(y, groups, k, n_splits, shuffle, seed):
    splitter = StratifiedGroupKFold(n_splits=n_splits, shuffle=shuffle, random_state=seed if shuffle else None)
    return balance(y, [test for _, test in splitter.split(np.zeros(len(y)), y, groups)], k)


def data_set(rng, rows, group_count, class_p, purity, size_power):
    """Groups of heavy-tailed sizes; each group has a main class and keeps it with probability purity."""
    k = len(class_p)
    sizes = np.maximum(1, np.round(rng.pareto(size_power, group_count) + 1)).astype(int)
    sizes = np.maximum(1, np.round(sizes * rows / sizes.sum())).astype(int)
    main = rng.choice(k, size=group_count, p=class_p)
    labels, groups = [], []
    for g in range(group_count):
        for _ in range(sizes[g]):
            labels.append(int(main[g]) if rng.random() < purity else int(rng.choice(k, p=class_p)))
            groups.append(int(g * 7 + 3))  # ids need not be 0..G-1
    order = rng.permutation(len(labels))
    return np.array(labels)[order], np.array(groups)[order]


def groups_per_class(y, groups, k):
    return [len(set(groups[y == c])) for c in range(k)]


rng = np.random.default_rng(20261206)
specs = [
    ("binary, 60 groups, mostly pure", 300, 60, [0.5, 0.5], 0.9, 2.0, 5),
    ("three classes 60/30/10, 100 groups", 500, 100, [0.6, 0.3, 0.1], 0.85, 2.5, 5),
    ("five classes, 150 heavy-tailed groups", 1000, 150, [0.35, 0.25, 0.2, 0.12, 0.08], 0.9, 1.5, 5),
    ("four classes, every row its own group", 400, 400, [0.4, 0.3, 0.2, 0.1], 1.0, 50.0, 5),
    ("binary, 30 mixed groups", 600, 30, [0.7, 0.3], 0.6, 2.0, 3),
    ("six classes, 300 heavy-tailed groups", 2000, 300, [0.3, 0.2, 0.15, 0.15, 0.1, 0.1], 0.8, 1.2, 5),
]
cases = []
for name, rows, group_count, class_p, purity, power, n_splits in specs:
    k = len(class_p)
    y, groups = data_set(rng, rows, group_count, class_p, purity, power)
    assert min(groups_per_class(y, groups, k)) >= n_splits, name
    fixed = []
    for s in SEEDS:
        perm = np.random.default_rng(s).permutation(group_count)
        renamed = perm[(groups - 3) // 7]
        fixed.append(figure(y, renamed, k, n_splits, False, None))
    cases.append({
        "name": name, "class_count": k, "folds": n_splits,
        "labels": y.tolist(), "groups": groups.tolist(),
        "shuffle": float(np.mean([figure(y, groups, k, n_splits, True, s) for s in SEEDS])),
        "no_shuffle": figure(y, groups, k, n_splits, False, None),
        "fixed_shuffle": float(np.mean(fixed)),
    })

sys.stdout.write('{"source": ' + json.dumps("scikit-learn " + sklearn.__version__ + " StratifiedGroupKFold")
                 + ',\n"cases": [\n')
sys.stdout.write(",\n".join(json.dumps(c, sort_keys=True) for c in cases))
sys.stdout.write("\n]}\n")
