#include "sqlite.h"

#include <sqlite3.h>

namespace tailwise::store::sql {

Statement::Statement(Connection &db, const char *sql)
{
    m_code = sqlite3_prepare_v2(db.handle(), sql, -1, &m_stmt, nullptr);
    if (m_code != SQLITE_OK)
        m_stmt = nullptr;
}

Statement::~Statement() { sqlite3_finalize(m_stmt); }

Statement &Statement::bind(int index, const std::string &text)
{
    sqlite3_bind_text(m_stmt, index, text.c_str(), static_cast<int>(text.size()), SQLITE_TRANSIENT);
    return *this;
}

Statement &Statement::bind(int index, double number)
{
    sqlite3_bind_double(m_stmt, index, number);
    return *this;
}

Statement &Statement::bind(int index, std::int64_t number)
{
    sqlite3_bind_int64(m_stmt, index, number);
    return *this;
}

Statement &Statement::bind(int index, const std::optional<double> &number)
{
    if (number)
        sqlite3_bind_double(m_stmt, index, *number);
    else
        sqlite3_bind_null(m_stmt, index);
    return *this;
}

bool Statement::step()
{
    m_code = sqlite3_step(m_stmt);
    return m_code == SQLITE_ROW;
}

void Statement::reset()
{
    sqlite3_reset(m_stmt);
    sqlite3_clear_bindings(m_stmt);
}

std::string Statement::text(int column) const
{
    const auto *p = sqlite3_column_text(m_stmt, column);
    return p ? std::string(reinterpret_cast<const char *>(p), static_cast<std::size_t>(sqlite3_column_bytes(m_stmt, column)))
             : std::string();
}

double Statement::number(int column) const { return sqlite3_column_double(m_stmt, column); }

std::int64_t Statement::integer(int column) const { return sqlite3_column_int64(m_stmt, column); }

std::optional<double> Statement::optionalNumber(int column) const
{
    if (sqlite3_column_type(m_stmt, column) == SQLITE_NULL)
        return std::nullopt;
    return sqlite3_column_double(m_stmt, column);
}

Connection::~Connection() { close(); }

int Connection::open(const std::string &path, int flags)
{
    return sqlite3_open_v2(path.c_str(), &m_db, flags, nullptr);
}

int Connection::exec(const char *sql) { return sqlite3_exec(m_db, sql, nullptr, nullptr, nullptr); }

std::string Connection::message() const { return m_db ? sqlite3_errmsg(m_db) : "out of memory"; }

void Connection::close()
{
    if (m_db)
        sqlite3_close_v2(m_db);
    m_db = nullptr;
}

} // namespace tailwise::store::sql
