#include "tailwise/store/historystore.h"

#include "sqlite.h"

#include <sqlite3.h>

#include <chrono>
#include <ctime>
#include <filesystem>
#include <system_error>

namespace tailwise::store {

namespace {

// Each step takes the schema from version i to i + 1; a new database runs them all.
const char *const kMigrations[] = {
    // 0 → 1
    "CREATE TABLE runs("
    " id INTEGER PRIMARY KEY,"
    " workbook TEXT NOT NULL, as_of TEXT NOT NULL, recorded_at TEXT NOT NULL,"
    " input_sha256 TEXT NOT NULL, assumptions TEXT NOT NULL, tool_version TEXT NOT NULL,"
    " portfolio_value REAL NOT NULL, var REAL NOT NULL, es REAL NOT NULL,"
    " UNIQUE(workbook, as_of, input_sha256));"
    "CREATE TABLE components("
    " run_id INTEGER NOT NULL REFERENCES runs(id), kind TEXT NOT NULL, name TEXT NOT NULL,"
    " exposure REAL NOT NULL, component_var REAL NOT NULL, component_es REAL NOT NULL);"
    "CREATE INDEX components_run ON components(run_id);",
    // 1 → 2: the day's realised P&L, the hashes of each part, the limits' states.
    "ALTER TABLE runs ADD COLUMN realised_pnl REAL;"
    "ALTER TABLE runs ADD COLUMN prices_sha256 TEXT NOT NULL DEFAULT '';"
    "ALTER TABLE runs ADD COLUMN holdings_sha256 TEXT NOT NULL DEFAULT '';"
    "ALTER TABLE runs ADD COLUMN assumptions_sha256 TEXT NOT NULL DEFAULT '';"
    "CREATE TABLE limits("
    " run_id INTEGER NOT NULL REFERENCES runs(id), measure TEXT NOT NULL, grp TEXT NOT NULL,"
    " limit_money REAL NOT NULL, warning_level REAL NOT NULL, value REAL NOT NULL, use REAL NOT NULL,"
    " state TEXT NOT NULL);"
    "CREATE INDEX limits_run ON limits(run_id);",
};
static_assert(sizeof(kMigrations) / sizeof(kMigrations[0]) == kHistorySchemaVersion);

std::string nowUtc()
{
    const std::time_t t = std::chrono::system_clock::to_time_t(std::chrono::system_clock::now());
    std::tm tm{};
    gmtime_r(&t, &tm);
    char buffer[32];
    std::strftime(buffer, sizeof buffer, "%Y-%m-%dT%H:%M:%SZ", &tm);
    return buffer;
}

} // namespace

struct HistoryStore::Impl {
    sql::Connection db;
    std::string path;
    int version = 0;
    int busyTimeoutMs = 30000;

    Error error(const std::string &what) const
    {
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, what);
    }

    // The message for a failed SQLite call: a lock held too long is said plainly.
    Error failure(int code, const std::string &doing) const
    {
        if (code == SQLITE_BUSY || code == SQLITE_LOCKED)
            return error("the history database is in use by another program (waited "
                         + std::to_string(busyTimeoutMs / 1000) + " s); " + doing);
        if (code == SQLITE_NOTADB)
            return error("not a Tailwise history database (not an SQLite database); it was left untouched");
        return error(db.message() + "; " + doing);
    }

    Result<std::int64_t> pragmaInt(const char *sql)
    {
        sql::Statement st(db, sql);
        if (!st.prepared())
            return failure(st.lastCode(), "nothing was read");
        if (!st.step())
            return failure(st.lastCode(), "nothing was read");
        return st.integer(0);
    }
};

HistoryStore::HistoryStore(std::unique_ptr<Impl> impl) : m_impl(std::move(impl)) {}
HistoryStore::~HistoryStore() = default;
HistoryStore::HistoryStore(HistoryStore &&) noexcept = default;
HistoryStore &HistoryStore::operator=(HistoryStore &&) noexcept = default;

int HistoryStore::schemaVersion() const { return m_impl->version; }
const std::string &HistoryStore::path() const { return m_impl->path; }

Result<HistoryStore> HistoryStore::open(const std::string &path, const OpenOptions &options)
{
    auto impl = std::make_unique<Impl>();
    impl->path = path;
    impl->busyTimeoutMs = options.busyTimeoutMs;
    std::error_code ec;
    const bool exists = std::filesystem::exists(path, ec);
    if (exists && std::filesystem::is_directory(path, ec))
        return impl->error("is a folder, not a history database");
    if (!exists && !options.create)
        return impl->error("no such history database");
    const int flags = SQLITE_OPEN_READWRITE | (exists ? 0 : SQLITE_OPEN_CREATE);
    if (const int code = impl->db.open(path, flags); code != SQLITE_OK)
        return impl->error("cannot open the history database: " + impl->db.message());
    sqlite3_busy_timeout(impl->db.handle(), options.busyTimeoutMs);

    auto check = [&]() -> Result<bool> { // true: the database needs creating or migrating
        const auto appId = impl->pragmaInt("PRAGMA application_id");
        if (!appId)
            return appId.error();
        const auto version = impl->pragmaInt("PRAGMA user_version");
        if (!version)
            return version.error();
        const auto tables = impl->pragmaInt("SELECT count(*) FROM sqlite_master");
        if (!tables)
            return tables.error();
        if (appId.value() == 0 && tables.value() == 0 && version.value() == 0) {
            impl->version = 0;
            return true;
        }
        if (appId.value() != kHistoryApplicationId)
            return impl->error("not a Tailwise history database (an SQLite database of another program); it was left untouched");
        if (version.value() > kHistorySchemaVersion)
            return impl->error("made by a newer Tailwise (history schema " + std::to_string(version.value())
                               + "); this version reads schema " + std::to_string(kHistorySchemaVersion)
                               + " and older; it was left untouched");
        impl->version = static_cast<int>(version.value());
        return impl->version < kHistorySchemaVersion;
    };
    auto needsWork = check();
    if (!needsWork)
        return needsWork.error();
    if (needsWork.value()) {
        if (const int code = impl->db.exec("BEGIN IMMEDIATE"); code != SQLITE_OK)
            return impl->failure(code, "the history database was not created or updated");
        needsWork = check(); // another program may have done it meanwhile
        if (!needsWork) {
            impl->db.exec("ROLLBACK");
            return needsWork.error();
        }
        for (int v = impl->version; needsWork.value() && v < kHistorySchemaVersion; ++v) {
            if (const int code = impl->db.exec(kMigrations[v]); code != SQLITE_OK) {
                const Error e = impl->failure(code, "the history database was left as it was");
                impl->db.exec("ROLLBACK");
                return e;
            }
        }
        const std::string stamp = "PRAGMA application_id = " + std::to_string(kHistoryApplicationId)
                                  + "; PRAGMA user_version = " + std::to_string(kHistorySchemaVersion) + ";";
        if (const int code = impl->db.exec(stamp.c_str()); code != SQLITE_OK) {
            const Error e = impl->failure(code, "the history database was left as it was");
            impl->db.exec("ROLLBACK");
            return e;
        }
        if (const int code = impl->db.exec("COMMIT"); code != SQLITE_OK) {
            const Error e = impl->failure(code, "the history database was left as it was");
            impl->db.exec("ROLLBACK");
            return e;
        }
        impl->version = kHistorySchemaVersion;
    }
    return HistoryStore(std::move(impl));
}

Status HistoryStore::createVersion1ForTest(const std::string &path)
{
    sql::Connection db;
    if (db.open(path, SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE) != SQLITE_OK)
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, db.message());
    const std::string sql = std::string(kMigrations[0]) + "PRAGMA application_id = " + std::to_string(kHistoryApplicationId)
                            + "; PRAGMA user_version = 1;";
    if (db.exec(sql.c_str()) != SQLITE_OK)
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, db.message());
    return Done{};
}

Result<bool> HistoryStore::record(const RunRecord &run)
{
    Impl &d = *m_impl;
    const std::string notRecorded = "nothing was recorded";
    if (const int code = d.db.exec("BEGIN IMMEDIATE"); code != SQLITE_OK)
        return d.failure(code, notRecorded);
    auto abort = [&](int code) {
        const Error e = d.failure(code, notRecorded);
        d.db.exec("ROLLBACK");
        return e;
    };
    {
        sql::Statement dup(d.db, "SELECT count(*) FROM runs WHERE workbook = ?1 AND as_of = ?2 AND input_sha256 = ?3");
        if (!dup.prepared())
            return abort(dup.lastCode());
        dup.bind(1, run.workbook).bind(2, run.asOf).bind(3, run.inputSha256);
        if (!dup.step())
            return abort(dup.lastCode());
        if (dup.integer(0) > 0) {
            d.db.exec("ROLLBACK");
            return false;
        }
    }
    std::int64_t id = 0;
    {
        sql::Statement ins(d.db,
                           "INSERT INTO runs(workbook, as_of, recorded_at, input_sha256, assumptions, tool_version,"
                           " portfolio_value, var, es, realised_pnl, prices_sha256, holdings_sha256, assumptions_sha256)"
                           " VALUES(?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8, ?9, ?10, ?11, ?12, ?13)");
        if (!ins.prepared())
            return abort(ins.lastCode());
        ins.bind(1, run.workbook).bind(2, run.asOf).bind(3, run.recordedAt.empty() ? nowUtc() : run.recordedAt);
        ins.bind(4, run.inputSha256).bind(5, run.assumptions).bind(6, run.toolVersion);
        ins.bind(7, run.portfolioValue).bind(8, run.var).bind(9, run.es).bind(10, run.realisedPnl);
        ins.bind(11, run.pricesSha256).bind(12, run.holdingsSha256).bind(13, run.assumptionsSha256);
        ins.step();
        if (ins.lastCode() != SQLITE_DONE)
            return abort(ins.lastCode());
        id = sqlite3_last_insert_rowid(d.db.handle());
    }
    {
        sql::Statement ins(d.db, "INSERT INTO components(run_id, kind, name, exposure, component_var, component_es)"
                                 " VALUES(?1, ?2, ?3, ?4, ?5, ?6)");
        if (!ins.prepared())
            return abort(ins.lastCode());
        for (const auto &c : run.components) {
            ins.reset();
            ins.bind(1, id).bind(2, c.kind).bind(3, c.name).bind(4, c.exposure).bind(5, c.componentVar).bind(6, c.componentEs);
            ins.step();
            if (ins.lastCode() != SQLITE_DONE)
                return abort(ins.lastCode());
        }
    }
    {
        sql::Statement ins(d.db, "INSERT INTO limits(run_id, measure, grp, limit_money, warning_level, value, use, state)"
                                 " VALUES(?1, ?2, ?3, ?4, ?5, ?6, ?7, ?8)");
        if (!ins.prepared())
            return abort(ins.lastCode());
        for (const auto &l : run.limits) {
            ins.reset();
            ins.bind(1, id).bind(2, l.measure).bind(3, l.group).bind(4, l.limit).bind(5, l.warningLevel);
            ins.bind(6, l.value).bind(7, l.use).bind(8, l.state);
            ins.step();
            if (ins.lastCode() != SQLITE_DONE)
                return abort(ins.lastCode());
        }
    }
    if (const int code = d.db.exec("COMMIT"); code != SQLITE_OK)
        return abort(code);
    return true;
}

Result<std::vector<RunRecord>> HistoryStore::runs(const std::string &workbook) const
{
    Impl &d = *m_impl;
    const std::string notRead = "the history was not read";
    std::vector<RunRecord> out;
    sql::Statement st(d.db, "SELECT id, workbook, as_of, recorded_at, input_sha256, assumptions, tool_version,"
                            " portfolio_value, var, es, realised_pnl, prices_sha256, holdings_sha256, assumptions_sha256"
                            " FROM runs WHERE ?1 = '' OR workbook = ?1 ORDER BY workbook, as_of, id");
    if (!st.prepared())
        return d.failure(st.lastCode(), notRead);
    st.bind(1, workbook);
    while (st.step()) {
        RunRecord r;
        r.id = st.integer(0);
        r.workbook = st.text(1);
        r.asOf = st.text(2);
        r.recordedAt = st.text(3);
        r.inputSha256 = st.text(4);
        r.assumptions = st.text(5);
        r.toolVersion = st.text(6);
        r.portfolioValue = st.number(7);
        r.var = st.number(8);
        r.es = st.number(9);
        r.realisedPnl = st.optionalNumber(10);
        r.pricesSha256 = st.text(11);
        r.holdingsSha256 = st.text(12);
        r.assumptionsSha256 = st.text(13);
        out.push_back(std::move(r));
    }
    if (st.lastCode() != SQLITE_DONE)
        return d.failure(st.lastCode(), notRead);
    sql::Statement comp(d.db, "SELECT kind, name, exposure, component_var, component_es FROM components WHERE run_id = ?1 ORDER BY rowid");
    sql::Statement lim(d.db, "SELECT measure, grp, limit_money, warning_level, value, use, state FROM limits WHERE run_id = ?1 ORDER BY rowid");
    if (!comp.prepared() || !lim.prepared())
        return d.failure(comp.prepared() ? lim.lastCode() : comp.lastCode(), notRead);
    for (auto &r : out) {
        comp.reset();
        comp.bind(1, r.id);
        while (comp.step())
            r.components.push_back({comp.text(0), comp.text(1), comp.number(2), comp.number(3), comp.number(4)});
        lim.reset();
        lim.bind(1, r.id);
        while (lim.step())
            r.limits.push_back({lim.text(0), lim.text(1), lim.number(2), lim.number(3), lim.number(4), lim.number(5), lim.text(6)});
    }
    return out;
}

Result<std::vector<std::string>> HistoryStore::workbooks() const
{
    Impl &d = *m_impl;
    std::vector<std::string> out;
    sql::Statement st(d.db, "SELECT DISTINCT workbook FROM runs ORDER BY workbook");
    if (!st.prepared())
        return d.failure(st.lastCode(), "the history was not read");
    while (st.step())
        out.push_back(st.text(0));
    return out;
}

} // namespace tailwise::store
