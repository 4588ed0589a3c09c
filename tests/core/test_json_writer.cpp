// The core's JSON writer (json.h) read back by an independent parser (QJsonDocument): valid
// JSON, escapes, numbers that read back to the same double, and never a NaN token.
#include "tailwise/json.h"

#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QTest>

#include <charconv>
#include <cmath>
#include <limits>
#include <random>

using namespace tailwise;

class TestJsonWriter : public QObject {
    Q_OBJECT

private slots:
    void nestedDocumentParses()
    {
        JsonWriter w;
        w.beginObject();
        w.key("name").value("Say \"hi\"\\ \n\t\x01 ünïcode");
        w.key("count").value(3);
        w.key("flag").value(true);
        w.key("missing").value(std::optional<double>());
        w.key("list").beginArray().value(1.5).value(-0.25).beginObject().endObject().beginArray().endArray().endArray();
        w.key("empty").beginObject().endObject();
        w.endObject();
        QJsonParseError error;
        const QJsonDocument doc = QJsonDocument::fromJson(QByteArray::fromStdString(w.text()), &error);
        QVERIFY2(!doc.isNull(), qPrintable(error.errorString() + "\n" + QString::fromStdString(w.text())));
        const QJsonObject o = doc.object();
        QCOMPARE(o["name"].toString(), QString::fromUtf8("Say \"hi\"\\ \n\t\x01 ünïcode"));
        QCOMPARE(o["count"].toInt(), 3);
        QCOMPARE(o["flag"].toBool(), true);
        QVERIFY(o["missing"].isNull());
        QCOMPARE(o["list"].toArray().size(), 4);
        QCOMPARE(o["list"].toArray()[1].toDouble(), -0.25);
    }

    void compactFormParses()
    {
        JsonWriter w(0);
        w.beginArray().value(1).value("a").endArray();
        QCOMPARE(w.text(), std::string("[1,\"a\"]"));
    }

    void numbersReadBackExactly()
    {
        // Shortest round-trip text (json.h): from_chars of the text gives the same double.
        std::mt19937_64 rng(42);
        std::uniform_int_distribution<int> exponent(-300, 300);
        std::uniform_real_distribution<double> mantissa(-10.0, 10.0);
        for (int i = 0; i < 2000; ++i) {
            const double x = mantissa(rng) * std::pow(10.0, exponent(rng));
            const std::string text = formatShortest(x);
            double back = 0.0;
            const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), back);
            QVERIFY2(ec == std::errc() && end == text.data() + text.size() && back == x,
                     qPrintable(QStringLiteral("%1 → \"%2\"").arg(x, 0, 'g', 17).arg(QString::fromStdString(text))));
        }
        QCOMPARE(formatShortest(0.1), std::string("0.1"));
        QCOMPARE(formatShortest(29309.228270), std::string("29309.22827"));
    }

#ifdef NDEBUG
    void nonFiniteBecomesNull()
    {
        // A programmer error (asserted in debug builds); in release the file still never holds NaN.
        JsonWriter w;
        w.beginArray()
            .value(std::numeric_limits<double>::quiet_NaN())
            .value(std::numeric_limits<double>::infinity())
            .endArray();
        QVERIFY2(w.text().find("nan") == std::string::npos && w.text().find("inf") == std::string::npos, w.text().c_str());
        const QJsonDocument doc = QJsonDocument::fromJson(QByteArray::fromStdString(w.text()));
        QVERIFY(doc.isArray());
        QVERIFY(doc.array()[0].isNull());
        QVERIFY(doc.array()[1].isNull());
    }
#endif
};

QTEST_GUILESS_MAIN(TestJsonWriter)
#include "test_json_writer.moc"
