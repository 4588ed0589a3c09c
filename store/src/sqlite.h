// A small layer over SQLite's C API: a connection and prepared statements with RAII, binding and
// reading by position, and errors as tailwise::Error naming the database file.
#pragma once

#include "tailwise/result.h"

#include <cstdint>
#include <optional>
#include <string>

struct sqlite3;
struct sqlite3_stmt;

namespace tailwise::store::sql {

class Connection;

class Statement {
public:
    Statement(Connection &db, const char *sql);
    ~Statement();
    Statement(const Statement &) = delete;
    Statement &operator=(const Statement &) = delete;

    bool prepared() const { return m_stmt != nullptr; }
    Statement &bind(int index, const std::string &text);
    Statement &bind(int index, double number);
    Statement &bind(int index, std::int64_t number);
    Statement &bind(int index, const std::optional<double> &number);
    // SQLITE_ROW: true; SQLITE_DONE: false; any other code is kept in lastCode().
    bool step();
    int lastCode() const { return m_code; }
    void reset();

    std::string text(int column) const;
    double number(int column) const;
    std::int64_t integer(int column) const;
    std::optional<double> optionalNumber(int column) const;

private:
    sqlite3_stmt *m_stmt = nullptr;
    int m_code = 0;
};

class Connection {
public:
    Connection() = default;
    ~Connection();
    Connection(const Connection &) = delete;
    Connection &operator=(const Connection &) = delete;

    // flags: SQLite's open flags.
    int open(const std::string &path, int flags);
    sqlite3 *handle() const { return m_db; }
    // Runs SQL without results; returns SQLite's code.
    int exec(const char *sql);
    std::string message() const;
    void close();

private:
    sqlite3 *m_db = nullptr;
};

} // namespace tailwise::store::sql
