#!/usr/bin/env python3
"""Writes the seed bundles of BundleReaderFuzzTest (model-core test resources).

Run from the repository root: scripts/fuzz-bundle-seeds.py .  The files are committed; run this
again only to change them. Raw-layer seeds are hostile archives (APPNOTE 6.3.x local headers,
central directory and end record written byte by byte, as the bundle writer lays them out);
checksum-fixed seeds are sound archives around damaged contents.
"""
import hashlib, json, struct, sys, zlib, os, zipfile
root = sys.argv[1]
frozen = open(os.path.join(root, 'model-core/src/test/resources/bundles/format-1.pmb'), 'rb').read()
base = os.path.join(root, 'model-core/src/test/resources/dev/pressmark/core/fuzz/BundleReaderFuzzTestInputs')
RAW = os.path.join(base, 'any_bytes_load_as_a_bundle_or_fail_with_a_bundle_exception')
FIXED = os.path.join(base, 'entries_under_matching_checksums_load_or_fail_with_a_pressmark_exception')
for d in (RAW, FIXED):
    os.makedirs(d, exist_ok=True)

def raw_zip(entries):
    """entries: (name, data, declared_size, method); stored layout as the bundle writer makes it."""
    local, central = b'', b''
    for name, data, declared, method in entries:
        n = name.encode('utf-8')
        crc = zlib.crc32(data) & 0xffffffff
        offset = len(local)
        local += struct.pack('<IHHHIIIIHH', 0x04034b50, 10, 0x800, method, 0x28210000, crc, declared, declared, len(n), 0) + n + data
        central += struct.pack('<IHHHHIIIIHHHHHII', 0x02014b50, 20, 10, 0x800, method, 0x28210000, crc, declared, declared,
                               len(n), 0, 0, 0, 0, 0, offset) + n
    end = struct.pack('<IHHHHIIH', 0x06054b50, 0, 0, len(entries), len(entries), len(central), len(local), 0)
    return local + central + end

def canonical(obj):
    return (json.dumps(obj, sort_keys=True, separators=(',', ':')) + '\n').encode()

def bundle(parts, manifest_extra=None, order=None):
    manifest = {'name': 'tiny', 'created': '2026-01-01T00:00:00Z', 'format_version': 1,
                'labels': ['ham', 'spam'], 'input_fields': ['title'],
                'classifier': {'kind': 'linear-svm', 'probabilities': True, 'platt': [{'a': -2.0, 'b': 0.1}]},
                'entries': {k: {'sha256': hashlib.sha256(v).hexdigest(), 'size': len(v)} for k, v in parts.items()}}
    manifest.update(manifest_extra or {})
    names = order or ['tokenizer.json', 'features.json', 'weights.bin', 'profile.json']
    return raw_zip([('manifest.json', canonical(manifest), len(canonical(manifest)), 0)] +
                   [(k, parts[k], len(parts[k]), 0) for k in names])

def weights(classes, scores, features, bias, values):
    return b'PMWB' + struct.pack('<iiiid', 1, classes, scores, features, bias) + struct.pack('<%dd' % len(values), *values)

tiny = {
    'tokenizer.json': canonical({'kind': 'wordpiece', 'max_word_chars': 20,
                                 'normalizer': {'cjk': True, 'lowercase': True, 'strip_accents': True},
                                 'vocabulary': ['[PAD]', '[UNK]', '[CLS]', '[SEP]', '[MASK]', 'free', 'win', '##s', 'hi']}),
    'features.json': canonical({'columns': ['title'], 'format_version': 1, 'max_tokens': 10, 'scaling': 'l2',
                                'training_rows': 4, 'weighting': 'tf',
                                'features': [{'column': 'title', 'document_frequency': 2, 'token': 'free'},
                                             {'column': 'title', 'document_frequency': 1, 'token': '##s'}]}),
    'weights.bin': weights(2, 1, 2, 1.0, [1.5, -0.5, 0.25]),
    'profile.json': canonical({'rows': 4, 'tokens': 9, 'unknown_rate': 0.0}),
}

def write(d, name, data):
    open(os.path.join(d, name), 'wb').write(data)

for d in (RAW, FIXED):
    write(d, 'frozen-format-1.pmb', frozen)
    write(d, 'tiny-valid.pmb', bundle(tiny))

# Raw-layer seeds: the archive itself is hostile.
manifest_only = canonical({'format_version': 1, 'entries': {}})
write(RAW, 'huge-declared-size.pmb', raw_zip([('manifest.json', manifest_only, len(manifest_only), 0),
                                              ('tokenizer.json', b'{}', 0xFFFFFFFF, 0)]))
write(RAW, 'parent-directory-name.pmb', raw_zip([('manifest.json', manifest_only, len(manifest_only), 0),
                                                 ('../x', b'escape', 6, 0)]))
write(RAW, 'duplicate-entries.pmb', raw_zip([('manifest.json', manifest_only, len(manifest_only), 0),
                                             ('tokenizer.json', b'{}', 2, 0), ('tokenizer.json', b'{}', 2, 0)]))
bomb = zlib.compressobj(9, zlib.DEFLATED, -15)
deflated = bomb.compress(b'\0' * (8 << 20)) + bomb.flush()
write(RAW, 'deflated-bomb.pmb', raw_zip([('manifest.json', deflated, len(deflated), 8)]))
write(RAW, 'manifest-of-another-version.pmb', raw_zip([('manifest.json', b'{"format_version":99}', 21, 0)]))
write(RAW, 'truncated.pmb', bundle(tiny)[:300])

# Checksum-fixed seeds: the archive is sound, the contents are not.
def with_part(name, data, **kw):
    parts = dict(tiny); parts[name] = data
    return bundle(parts, **kw)
# scores * (features + 1) * 8 wraps to 0 in 64 bits, so a 28-byte file passes the size check
write(FIXED, 'weights-size-overflow.pmb', with_part('weights.bin', weights(1 << 30, 1 << 30, 0x7FFFFFFF, 1.0, [])))
write(FIXED, 'weights-nan.pmb', with_part('weights.bin', weights(2, 1, 2, 1.0, [float('nan'), 0.0, 0.0])))
write(FIXED, 'features-standardize.pmb', with_part('features.json', canonical({
    'columns': ['title'], 'format_version': 1, 'max_tokens': 10, 'scaling': 'standardize', 'training_rows': 4,
    'weighting': 'tfidf', 'idf': [1.2, 0.0], 'means': [0.1, None], 'standard_deviations': [0.0, -1.0],
    'features': [{'column': 'title', 'document_frequency': 2, 'token': 'free'},
                 {'column': 'title', 'document_frequency': 9, 'token': 'free'}]})))
write(FIXED, 'tokenizer-word-kind.pmb', with_part('tokenizer.json', canonical({
    'kind': 'word', 'max_word_chars': 0, 'normalizer': {'cjk': False, 'lowercase': False, 'strip_accents': False}})))
write(FIXED, 'tokenizer-bad-vocabulary.pmb', with_part('tokenizer.json', canonical({
    'kind': 'wordpiece', 'max_word_chars': 3, 'normalizer': None, 'vocabulary': ['##', ' a', 'a', 'a', None]})))
write(FIXED, 'labels-and-platt-mismatch.pmb', bundle(tiny, manifest_extra={
    'labels': ['only', None, {}], 'classifier': {'kind': 'logistic-regression', 'platt': [{'a': 'x'}, {}]}}))
write(FIXED, 'three-classes.pmb', with_part('weights.bin', weights(3, 3, 2, 1.0, [0.5] * 9),
                                            manifest_extra={'labels': ['a', 'b', 'c'], 'classifier': {'kind': 'linear-svm', 'platt': []}}))
