// Failures that lose work or print a wrong figure, each reproduced on the core: a write that fails
// part-way (every byte position), a replaced device, an output that is an input, confidences at
// the edges, hostile text, unusable prices, Cornish–Fisher outside its monotone domain, figures
// that need a caution, and a book too large to estimate.
#include "../fulldiskwrite.h"
#include "tailwise/assumptions.h"
#include "tailwise/cornishfisher.h"
#include "tailwise/filewrite.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"
#include "tailwise/textlimits.h"

#include <QDir>
#include <QFileInfo>
#include <QTemporaryDir>
#include <QTest>

#include <cerrno>
#include <cmath>
#include <fstream>
#include <sstream>
#include <string>

#include <sys/stat.h>
#include <unistd.h>

using namespace tailwise;

namespace {

using tailwise::test::limitedWrite;
int failingFsync(int) { errno = EIO; return -1; }

std::string readAll(const std::string &path)
{
    std::ifstream in(path, std::ios::binary);
    std::stringstream s;
    s << in.rdbuf();
    return s.str();
}

void writeText(const std::string &path, const std::string &text)
{
    std::ofstream out(path, std::ios::binary);
    out << text;
}

int filesIn(const QString &folder)
{
    return static_cast<int>(QDir(folder).entryList(QDir::Files | QDir::Hidden | QDir::System).size());
}

struct RestoreWrites {
    ~RestoreWrites() { testing::setFileWriteFunctions(nullptr, nullptr); }
};

} // namespace

class TestReliability : public QObject {
    Q_OBJECT
private slots:
    // §1: a disk that fills at every byte position of the new file: never success, the old file
    // byte-for-byte unchanged, no temporary file left, the system's reason in the message.
    void failedWriteNeverLooksLikeASave()
    {
        QTemporaryDir dir;
        const std::string path = dir.filePath("book.tailwise").toStdString();
        const std::string old = "the previous good file\n";
        writeText(path, old);
        std::string next;
        for (int i = 0; i < 300; ++i)
            next += static_cast<char>('a' + i % 26);
        RestoreWrites restore;
        testing::setFileWriteFunctions(limitedWrite);
        for (std::size_t n = 0; n < next.size(); ++n) {
            tailwise::test::g_writeBudget = n;
            const Status s = writeFileReplacing(path, next);
            QVERIFY2(!s.ok(), qPrintable(QString("a write failing after %1 bytes was reported as saved").arg(n)));
            QVERIFY2(s.error().message.find("could not save " + path + ": No space left on device") != std::string::npos,
                     s.error().message.c_str());
            QCOMPARE(readAll(path), old);
            QCOMPARE(filesIn(dir.path()), 1);
        }
        tailwise::test::g_writeBudget = next.size(); // exactly enough: saved
        QVERIFY(writeFileReplacing(path, next).ok());
        QCOMPARE(readAll(path), next);
        // fsync failing (a full disk or quota often shows only there): not saved, old file kept.
        writeText(path, old);
        testing::setFileWriteFunctions(nullptr, failingFsync);
        const Status s = writeFileReplacing(path, next);
        QVERIFY(!s.ok());
        QVERIFY2(s.error().message.find("Input/output error") != std::string::npos, s.error().message.c_str());
        QCOMPARE(readAll(path), old);
        QCOMPARE(filesIn(dir.path()), 1);
    }

    // §2: only a regular file is replaced; a symbolic link keeps pointing at the new contents.
    void onlyRegularFilesAreReplaced()
    {
        for (const char *device : {"/dev/null", "/dev/full"}) {
            struct stat before {};
            QVERIFY(::stat(device, &before) == 0);
            const Status s = writeFileReplacing(device, "x");
            QVERIFY(!s.ok());
            QVERIFY2(s.error().message.find("a device") != std::string::npos, s.error().message.c_str());
            struct stat after {};
            QVERIFY(::stat(device, &after) == 0);
            QVERIFY(S_ISCHR(after.st_mode) && after.st_ino == before.st_ino);
        }
        QTemporaryDir dir;
        const std::string fifo = dir.filePath("pipe").toStdString();
        QVERIFY(::mkfifo(fifo.c_str(), 0600) == 0);
        Status s = writeFileReplacing(fifo, "x");
        QVERIFY(!s.ok() && s.error().message.find("FIFO") != std::string::npos);
        s = writeFileReplacing(dir.path().toStdString(), "x");
        QVERIFY(!s.ok() && s.error().message.find("a folder") != std::string::npos);
        const std::string target = dir.filePath("target.csv").toStdString();
        const std::string link = dir.filePath("link.csv").toStdString();
        writeText(target, "old");
        QVERIFY(::symlink(target.c_str(), link.c_str()) == 0);
        QVERIFY(writeFileReplacing(link, "new").ok());
        struct stat l {};
        QVERIFY(::lstat(link.c_str(), &l) == 0 && S_ISLNK(l.st_mode));
        QCOMPARE(readAll(target), std::string("new"));
    }

    // §2: the output may not be an input, however it is spelled (another path, a hard link).
    void outputIsNeverAnInput()
    {
        QTemporaryDir dir;
        const std::string input = dir.filePath("prices.csv").toStdString();
        writeText(input, "date,A\n");
        const std::string spelled = dir.path().toStdString() + "/./../" + QFileInfo(dir.path()).fileName().toStdString()
                                    + "/prices.csv";
        const std::string hard = dir.filePath("hard.csv").toStdString();
        QVERIFY(::link(input.c_str(), hard.c_str()) == 0);
        for (const std::string &out : {input, spelled, hard}) {
            const Status s = checkOutputIsNotAnInput(out, {"holdings.csv", input});
            QVERIFY2(!s.ok(), out.c_str());
            QVERIFY(s.error().message.find(input) != std::string::npos && s.error().message.find(out) != std::string::npos);
        }
        QVERIFY(checkOutputIsNotAnInput(dir.filePath("new.pdf").toStdString(), {input}).ok());
        QVERIFY(checkOutputIsNotAnInput("-", {input}).ok());
    }

    // §3: confidence only from 0.5 to 0.9999; the edges themselves give finite figures.
    void confidenceInItsStatedRange()
    {
        for (const double c : {1e-17, 0.0, 0.49, 0.99991, 1.0 - 1e-16, 1.0}) {
            Assumptions a;
            a.confidence = c;
            const Status s = validate(a);
            QVERIFY2(!s.ok(), qPrintable(QString::number(c, 'g', 17)));
            QVERIFY(s.error().message.find("from 0.5 to 0.9999") != std::string::npos);
        }
        for (const double c : {0.5, 0.9999}) {
            Assumptions a;
            a.confidence = c;
            for (const RiskModel m : {RiskModel::Normal, RiskModel::StudentT}) {
                a.model = m;
                a.dof = DegreesOfFreedom::given(2.5);
                if (m == RiskModel::Normal)
                    a.dof = DegreesOfFreedom{};
                const auto r = computeSinglePositionRisk(SinglePosition{1e6, 0.2, 0.0}, a);
                QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
                QVERIFY(std::isfinite(r.value().figures.var) && std::isfinite(r.value().figures.es));
            }
        }
    }

    // §4 and §6: names bounded, valid UTF-8, no control characters; the message names line and column.
    void hostileTextRefusedAtRead()
    {
        const std::string longName(101, 'N');
        auto r = parsePriceCsv("date,A," + longName + "\n2024-01-02,1,2\n2024-01-03,1,2\n2024-01-04,1,2\n", "p.csv");
        QVERIFY(!r.ok());
        QVERIFY2(r.error().message.find("p.csv, line 1, column 3") != std::string::npos, r.error().message.c_str());
        QVERIFY(r.error().message.find("longer than 100 characters (found 101)") != std::string::npos);
        r = parsePriceCsv("date,A,B\xff\n2024-01-02,1,2\n2024-01-03,1,2\n2024-01-04,1,2\n", "p.csv");
        QVERIFY(!r.ok());
        QVERIFY2(r.error().message.find("line 1, column 3") != std::string::npos && r.error().message.find("UTF-8") != std::string::npos,
                 r.error().message.c_str());
        r = parsePriceCsv("date,A,B\x1b[31m\n2024-01-02,1,2\n2024-01-03,1,2\n2024-01-04,1,2\n", "p.csv");
        QVERIFY(!r.ok());
        QVERIFY2(r.error().message.find("control character (U+001B)") != std::string::npos, r.error().message.c_str());
        const auto h = parseHoldingsCsv("asset,quantity\nA\xc0\xaf,1\n", "h.csv", nullptr); // an overlong '/'
        QVERIFY(!h.ok());
        QVERIFY2(h.error().message.find("h.csv, line 2, column 1") != std::string::npos, h.error().message.c_str());
        // 100 characters of two bytes each is within the bound (characters, not bytes); tabs pass.
        std::string accented;
        for (int i = 0; i < 100; ++i)
            accented += "\xc3\xa9";
        QVERIFY(!checkText(accented, maxNameChars));
        QVERIFY(!checkText("a\tb", maxNameChars));
        QVERIFY(checkText(accented + "e", maxNameChars));
    }

    // §5: a subnormal price, or a ratio between days that overflows, is refused naming its line and
    // column (it gave a VaR of 0, or an infinite return).
    void unusablePricesRefusedNamingThePlace()
    {
        auto r = parsePriceCsv("date,A,B\n2024-01-02,1,5e-324\n2024-01-03,1,5e-324\n2024-01-04,1,5e-324\n", "p.csv");
        QVERIFY(!r.ok());
        QVERIFY2(r.error().message.find("p.csv, line 2, column 3") != std::string::npos, r.error().message.c_str());
        QVERIFY(r.error().message.find("subnormal") != std::string::npos);
        r = parsePriceCsv("date,A,B\n2024-01-02,1,1e-300\n2024-01-03,1,1e300\n2024-01-04,1,1\n", "p.csv");
        QVERIFY(!r.ok());
        QVERIFY2(r.error().message.find("p.csv, line 3, column 3") != std::string::npos, r.error().message.c_str());
        QVERIFY(r.error().message.find("overflows") != std::string::npos);
        // Small but normal prices with ordinary ratios are fine.
        QVERIFY(parsePriceCsv("date,A\n2024-01-02,1e-300\n2024-01-03,1.1e-300\n2024-01-04,1e-300\n", "p.csv").ok());
    }

    // §5: outside the monotone domain, ES is never below VaR (the stated fallback).
    void cornishFisherNeverGivesEsBelowVar()
    {
        int outside = 0;
        for (double s = -3.0; s <= 3.0; s += 0.25)
            for (double k = -3.0; k <= 30.0; k += 0.5)
                for (const double c : {0.9, 0.95, 0.99, 0.999}) {
                    const CornishFisherFactors f = cornishFisherFactors(c, Shape{s, k});
                    outside += f.monotone ? 0 : 1;
                    QVERIFY2(f.es >= f.var, qPrintable(QString("S %1, K %2, C %3: ES %4 < VaR %5").arg(s).arg(k).arg(c).arg(f.es).arg(f.var)));
                }
        QVERIFY(outside > 0); // the grid reaches outside the domain
    }

    // §5: the cautions a figure needs: ν below 3, a loss above the book's value, a horizon longer
    // than the window.
    void figuresThatNeedACautionSaySo()
    {
        auto has = [](const RiskReport &r, const char *words) {
            for (const auto &w : r.warnings)
                if (w.find(words) != std::string::npos)
                    return true;
            return false;
        };
        Assumptions a;
        a.model = RiskModel::StudentT;
        a.dof = DegreesOfFreedom::given(2.05);
        auto r = computeSinglePositionRisk(SinglePosition{1e6, 0.2, 0.0}, a);
        QVERIFY(r.ok());
        QVERIFY(has(r.value(), "below 3"));
        a = Assumptions{};
        a.horizonDays = 10000;
        r = computeSinglePositionRisk(SinglePosition{1e6, 0.6, 0.0}, a);
        QVERIFY(r.ok());
        QVERIFY2(r.value().figures.var > 1e6, "the case needs VaR above the value");
        QVERIFY(has(r.value(), "exceeds the portfolio's value"));
        // A horizon of 20 days on a window of 5 returns.
        auto parsed = parsePriceCsv("date,A,B\n2024-01-01,100,50\n2024-01-02,101,49\n2024-01-03,99,51\n2024-01-04,102,50\n"
                                    "2024-01-05,100,52\n2024-01-08,103,51\n",
                                    "p.csv");
        QVERIFY(parsed.ok());
        Holdings h{Holding{"A", 10.0, {}, {}}, Holding{"B", 5.0, {}, {}}};
        a = Assumptions{};
        a.horizonDays = 20;
        r = computeRisk(parsed.value(), h, a);
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        QVERIFY(has(r.value(), "longer than the 5 daily returns"));
    }

    // §4: a book too large to estimate from its few returns is refused before any N × N work
    // (it took minutes and gigabytes).
    void hugeBookWithFewReturnsRefusedEarly()
    {
        const int n = 12000;
        PriceHistory p;
        p.prices = Eigen::MatrixXd::Constant(3, n, 100.0);
        p.prices.row(1).array() = 101.0;
        for (int i = 0; i < n; ++i)
            p.assets.push_back(std::to_string(i).insert(0, 1, 'A'));
        p.dates = {Date{19724}, Date{19725}, Date{19726}};
        Holdings h;
        for (int i = 0; i < n; ++i)
            h.push_back(Holding{p.assets[static_cast<std::size_t>(i)], 1.0, {}, {}});
        const auto r = computeRisk(p, h, Assumptions{});
        QVERIFY(!r.ok());
        QVERIFY2(r.error().message.find("12000 holdings with only 2 daily returns") != std::string::npos,
                 r.error().message.c_str());
    }
};

QTEST_GUILESS_MAIN(TestReliability)
#include "test_reliability.moc"
