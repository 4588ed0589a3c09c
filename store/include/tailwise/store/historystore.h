// The history of recorded runs: each run's workbook, as-of date, input hashes, assumptions,
// figures, components and limit states, in an SQLite database file of our own schema.
//
// The file is ours when SQLite's application_id is kHistoryApplicationId; its schema version is
// SQLite's user_version. Opening:
//   - a missing or empty file is created with the current schema;
//   - an older schema is migrated forward in one transaction (v1 → v2 adds the realised P&L, the
//     per-part hashes and the limits table);
//   - a database of a newer schema, a database that is not ours, or a file that is not an SQLite
//     database is refused by name and left untouched.
// Writes are transactions (BEGIN IMMEDIATE … COMMIT), so a run killed mid-write leaves the
// database as it was (SQLite's rollback journal). A database locked by another writer is waited
// for up to the busy timeout (30 s by default), then refused with a message; nothing is recorded.
// A run is recorded once: the same workbook, as-of date and input hash is not recorded twice.
#pragma once

#include "tailwise/result.h"

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <vector>

namespace tailwise::store {

inline constexpr std::int32_t kHistoryApplicationId = 0x54574853; // "TWHS"
inline constexpr int kHistorySchemaVersion = 2;

struct RecordedComponent {
    std::string kind; // "holding" or "group"
    std::string name;
    double exposure = 0.0;
    double componentVar = 0.0;
    double componentEs = 0.0;
};

struct RecordedLimit {
    std::string measure; // "var", "es"
    std::string group;   // empty: the book
    double limit = 0.0;  // money
    double warningLevel = 0.8;
    double value = 0.0;
    double use = 0.0;
    std::string state; // "ok", "warning", "breached"
};

struct RunRecord {
    std::int64_t id = 0;       // set by the store
    std::string workbook;      // the workbook's title (or its file name when untitled)
    std::string asOf;          // YYYY-MM-DD
    std::string recordedAt;    // UTC, YYYY-MM-DDTHH:MM:SSZ; set by the store when empty
    std::string inputSha256;   // inputhash.h
    std::string pricesSha256;  // parts, so that a change can be explained by what changed
    std::string holdingsSha256;
    std::string assumptionsSha256;
    std::string assumptions;   // canonical "name=value" lines (inputhash.h)
    std::string toolVersion;
    double portfolioValue = 0.0;
    double var = 0.0;
    double es = 0.0;
    std::optional<double> realisedPnl; // the holdings' P&L on the as-of day, when the history has the day before
    std::vector<RecordedComponent> components;
    std::vector<RecordedLimit> limits;
};

struct OpenOptions {
    int busyTimeoutMs = 30000;
    bool create = true; // false: a missing file is an error (reading the history)
};

class HistoryStore {
public:
    ~HistoryStore();
    HistoryStore(HistoryStore &&) noexcept;
    HistoryStore &operator=(HistoryStore &&) noexcept;

    static Result<HistoryStore> open(const std::string &path, const OpenOptions &options = {});

    // Appends the run in one transaction. Returns false (and records nothing) when a run of the
    // same workbook, as-of date and input hash is already there.
    Result<bool> record(const RunRecord &run);
    // Runs in as-of order (then recording order); all workbooks when `workbook` is empty.
    Result<std::vector<RunRecord>> runs(const std::string &workbook = {}) const;
    Result<std::vector<std::string>> workbooks() const;

    int schemaVersion() const;
    const std::string &path() const;

    // For tests: creates an empty database of schema 1 (the previous version) at `path`.
    static Status createVersion1ForTest(const std::string &path);

private:
    struct Impl;
    explicit HistoryStore(std::unique_ptr<Impl> impl);
    std::unique_ptr<Impl> m_impl;
};

} // namespace tailwise::store
