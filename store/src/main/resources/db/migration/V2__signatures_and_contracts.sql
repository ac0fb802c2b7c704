-- Signed bundles and contract versions.
-- signature_json: the bundle's signature file as published (NULL when published unsigned).
-- contract_json: the version's contract version and its difference from the version active at
-- publish, {"version":"2.0.0","against":TAG,"diff":{...}}; NULL for versions published before this migration.
ALTER TABLE versions ADD COLUMN signature_json TEXT;
ALTER TABLE versions ADD COLUMN contract_json TEXT;

-- The public keys whose signatures the store accepts. While this table has a row, every published
-- or loaded version must carry a signature by one of them over its SHA-256.
CREATE TABLE trusted_keys (
    key_id CHAR(16) NOT NULL PRIMARY KEY,
    public_key_pem TEXT NOT NULL,
    added_at BIGINT NOT NULL,
    actor VARCHAR(200) NOT NULL
);
