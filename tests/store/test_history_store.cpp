// The history database: record and reopen, migrate from schema 1, refuse a newer schema and files
// that are not ours (untouched), wait for a lock and then refuse, and a writer killed mid-write
// leaves the database consistent. Consistency is SQLite's own check, PRAGMA integrity_check
// (sqlite.org/pragma.html#pragma_integrity_check), plus every run having all of its components.
#include "tailwise/store/historystore.h"

#include <sqlite3.h>

#include <QTemporaryDir>
#include <QTest>

#include <csignal>
#include <fstream>
#include <sstream>
#include <sys/wait.h>
#include <unistd.h>

using namespace tailwise::store;

namespace {

RunRecord sampleRun(const std::string &asOf, double var, int components = 3)
{
    RunRecord r;
    r.workbook = "Larchmere Growth";
    r.asOf = asOf;
    r.inputSha256 = "input-of-" + asOf;
    r.pricesSha256 = "prices-of-" + asOf;
    r.holdingsSha256 = "holdings-of-" + asOf;
    r.assumptionsSha256 = "assumptions-of-" + asOf;
    r.assumptions = "confidence=0.99\nhorizon=1\n";
    r.toolVersion = "0.1.0";
    r.portfolioValue = 1.0e6;
    r.var = var;
    r.es = var * 1.15;
    r.realisedPnl = -1234.5;
    for (int i = 0; i < components; ++i)
        r.components.push_back({"holding", "ASSET_" + std::to_string(i), 1000.0 * i, var / components, r.es / components});
    r.limits.push_back({"var", "", 30000.0, 0.8, var, var / 30000.0, var > 30000.0 ? "breached" : "ok"});
    return r;
}

std::string bytesOf(const QString &path)
{
    std::ifstream in(path.toStdString(), std::ios::binary);
    std::stringstream s;
    s << in.rdbuf();
    return s.str();
}

void execSql(const QString &path, const char *sql)
{
    sqlite3 *db = nullptr;
    QCOMPARE(sqlite3_open(path.toUtf8().constData(), &db), SQLITE_OK);
    QCOMPARE(sqlite3_exec(db, sql, nullptr, nullptr, nullptr), SQLITE_OK);
    sqlite3_close(db);
}

std::string queryText(sqlite3 *db, const char *sql)
{
    sqlite3_stmt *st = nullptr;
    std::string out;
    if (sqlite3_prepare_v2(db, sql, -1, &st, nullptr) == SQLITE_OK && sqlite3_step(st) == SQLITE_ROW)
        out = reinterpret_cast<const char *>(sqlite3_column_text(st, 0));
    sqlite3_finalize(st);
    return out;
}

} // namespace

class TestHistoryStore : public QObject {
    Q_OBJECT

private slots:
    void recordAndReopen()
    {
        QTemporaryDir dir;
        const std::string path = (dir.path() + "/history.db").toStdString();
        {
            auto store = HistoryStore::open(path);
            QVERIFY2(store.ok(), store.ok() ? "" : store.error().message.c_str());
            QCOMPARE(store.value().schemaVersion(), kHistorySchemaVersion);
            QVERIFY(store.value().record(sampleRun("2024-03-01", 25000.0)).value());
            QVERIFY(store.value().record(sampleRun("2024-03-04", 31000.0)).value());
            // The same workbook, date and inputs again: not recorded twice.
            QVERIFY(!store.value().record(sampleRun("2024-03-04", 31000.0)).value());
        }
        auto store = HistoryStore::open(path, OpenOptions{30000, false});
        QVERIFY(store.ok());
        const auto runs = store.value().runs("Larchmere Growth");
        QVERIFY(runs.ok());
        QCOMPARE(runs.value().size(), std::size_t(2));
        const RunRecord &second = runs.value()[1];
        QCOMPARE(second.asOf, std::string("2024-03-04"));
        QCOMPARE(second.var, 31000.0);
        QCOMPARE(second.es, 31000.0 * 1.15);
        QCOMPARE(*second.realisedPnl, -1234.5);
        QCOMPARE(second.components.size(), std::size_t(3));
        QCOMPARE(second.components[2].name, std::string("ASSET_2"));
        QCOMPARE(second.limits.size(), std::size_t(1));
        QCOMPARE(second.limits[0].state, std::string("breached"));
        QVERIFY(!second.recordedAt.empty());
        QCOMPARE(store.value().runs("Another").value().size(), std::size_t(0));
        QCOMPARE(store.value().workbooks().value(), std::vector<std::string>{"Larchmere Growth"});
        // Reading a missing file when not creating: refused by name.
        const auto missing = HistoryStore::open(path + ".none", OpenOptions{30000, false});
        QVERIFY(!missing.ok());
        QVERIFY(missing.error().message.find("no such history database") != std::string::npos);
    }

    void migratesFromSchemaOne()
    {
        QTemporaryDir dir;
        const QString path = dir.path() + "/old.db";
        QVERIFY(HistoryStore::createVersion1ForTest(path.toStdString()).ok());
        execSql(path, "INSERT INTO runs(workbook, as_of, recorded_at, input_sha256, assumptions, tool_version,"
                      " portfolio_value, var, es) VALUES('Old book', '2023-12-29', '2024-01-02T07:00:00Z', 'x', 'c', '0.0.9',"
                      " 500000, 9000, 11000);"
                      "INSERT INTO components VALUES(1, 'holding', 'A', 500000, 9000, 11000);");
        auto store = HistoryStore::open(path.toStdString());
        QVERIFY2(store.ok(), store.ok() ? "" : store.error().message.c_str());
        QCOMPARE(store.value().schemaVersion(), 2);
        auto runs = store.value().runs();
        QCOMPARE(runs.value().size(), std::size_t(1));
        QCOMPARE(runs.value()[0].var, 9000.0);
        QVERIFY(!runs.value()[0].realisedPnl);
        QCOMPARE(runs.value()[0].components.size(), std::size_t(1));
        QVERIFY(store.value().record(sampleRun("2024-01-02", 10000.0)).value());
        QCOMPARE(store.value().runs().value().size(), std::size_t(2));
    }

    void refusesNewerSchemaAndForeignFilesUntouched()
    {
        QTemporaryDir dir;
        const QString newer = dir.path() + "/newer.db";
        { QVERIFY(HistoryStore::open(newer.toStdString()).ok()); }
        execSql(newer, "PRAGMA user_version = 3");
        const std::string before = bytesOf(newer);
        auto r = HistoryStore::open(newer.toStdString());
        QVERIFY(!r.ok());
        QVERIFY(r.error().message.find("newer Tailwise (history schema 3)") != std::string::npos);
        QVERIFY(r.error().message.find(newer.toStdString()) != std::string::npos);
        QCOMPARE(bytesOf(newer), before);

        const QString foreign = dir.path() + "/other.db";
        execSql(foreign, "CREATE TABLE notes(text TEXT); INSERT INTO notes VALUES('keep me')");
        const std::string foreignBefore = bytesOf(foreign);
        r = HistoryStore::open(foreign.toStdString());
        QVERIFY(!r.ok());
        QVERIFY(r.error().message.find("another program") != std::string::npos);
        QCOMPARE(bytesOf(foreign), foreignBefore);

        const QString text = dir.path() + "/notes.txt";
        {
            std::ofstream out(text.toStdString());
            out << "date,price\n2024-01-02,10\n" << std::string(200, 'x') << "\n";
        }
        const std::string textBefore = bytesOf(text);
        r = HistoryStore::open(text.toStdString());
        QVERIFY(!r.ok());
        QVERIFY(r.error().message.find("not an SQLite database") != std::string::npos);
        QCOMPARE(bytesOf(text), textBefore);
    }

    void waitsForALockThenRefuses()
    {
        QTemporaryDir dir;
        const std::string path = (dir.path() + "/locked.db").toStdString();
        auto store = HistoryStore::open(path, OpenOptions{300, true});
        QVERIFY(store.ok());
        sqlite3 *other = nullptr;
        QCOMPARE(sqlite3_open(path.c_str(), &other), SQLITE_OK);
        QCOMPARE(sqlite3_exec(other, "BEGIN IMMEDIATE", nullptr, nullptr, nullptr), SQLITE_OK);
        const auto r = store.value().record(sampleRun("2024-03-01", 1.0));
        QVERIFY(!r.ok());
        QVERIFY(r.error().message.find("in use by another program") != std::string::npos);
        QVERIFY(r.error().message.find("nothing was recorded") != std::string::npos);
        sqlite3_exec(other, "ROLLBACK", nullptr, nullptr, nullptr);
        sqlite3_close(other);
        QCOMPARE(store.value().runs().value().size(), std::size_t(0));
        QVERIFY(store.value().record(sampleRun("2024-03-01", 1.0)).value());
    }

    void aWriterKilledMidWriteLeavesItConsistent()
    {
        QTemporaryDir dir;
        const std::string path = (dir.path() + "/killed.db").toStdString();
        constexpr int kComponents = 4000;
        { QVERIFY(HistoryStore::open(path).ok()); }
        const pid_t child = fork();
        QVERIFY(child >= 0);
        if (child == 0) {
            auto store = HistoryStore::open(path);
            for (int day = 0; store.ok(); ++day) { // records until killed
                RunRecord r = sampleRun("2024-01-01", 100.0 + day, kComponents);
                r.inputSha256 = std::to_string(day);
                (void)store.value().record(r);
            }
            _exit(0);
        }
        usleep(400 * 1000);
        kill(child, SIGKILL);
        int status = 0;
        waitpid(child, &status, 0);
        QVERIFY(WIFSIGNALED(status));
        sqlite3 *db = nullptr;
        QCOMPARE(sqlite3_open(path.c_str(), &db), SQLITE_OK);
        QCOMPARE(queryText(db, "PRAGMA integrity_check"), std::string("ok"));
        // All of a run or none of it: no run without all its components and its limit.
        QCOMPARE(queryText(db, "SELECT count(*) FROM runs r WHERE (SELECT count(*) FROM components c WHERE c.run_id = r.id) != 4000"
                               " OR (SELECT count(*) FROM limits l WHERE l.run_id = r.id) != 1"),
                 std::string("0"));
        QCOMPARE(queryText(db, "SELECT count(*) FROM components WHERE run_id NOT IN (SELECT id FROM runs)"), std::string("0"));
        sqlite3_close(db);
        auto store = HistoryStore::open(path);
        QVERIFY(store.ok());
        QVERIFY(store.value().record(sampleRun("2024-01-02", 5.0)).value());
    }
};

QTEST_GUILESS_MAIN(TestHistoryStore)
#include "test_history_store.moc"
