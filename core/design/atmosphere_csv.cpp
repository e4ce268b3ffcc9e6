#include "design/atmosphere_csv.hpp"

#include <array>
#include <charconv>
#include <cmath>
#include <optional>
#include <sstream>
#include <string_view>

#include <fmt/format.h>

#include "design/text_file.hpp"

namespace ds {
namespace {

enum class Column { altitude, density, temperature };

struct ColumnName {
    std::string_view name;
    Column column;
};

constexpr std::array column_names{
    ColumnName{"altitude_m", Column::altitude},
    ColumnName{"density_kg_m3", Column::density},
    ColumnName{"temperature_K", Column::temperature},
};

// A UTF-8 byte-order mark, which spreadsheet programs put at the start of exported CSV.
constexpr std::string_view byte_order_mark = "\xEF\xBB\xBF";

std::string_view trim(std::string_view text) {
    constexpr std::string_view blanks = " \t\r\n";
    const auto first = text.find_first_not_of(blanks);
    if (first == std::string_view::npos)
        return {};
    const auto last = text.find_last_not_of(blanks);
    return text.substr(first, last - first + 1);
}

// The most characters of a field that a reason quotes (our bound: enough to recognise it).
constexpr std::size_t quoted_characters = 40;

/// A field as a reason quotes it: its first characters, a byte other than printable ASCII shown
/// as \xNN. The file may be in any encoding, and the reason is shown in the window, printed
/// and handed to Python as a str, which needs UTF-8.
std::string quoted(std::string_view field) {
    std::string text;
    for (std::size_t i = 0; i < field.size() && i < quoted_characters; ++i) {
        const auto byte = static_cast<unsigned char>(field[i]);
        if (byte >= 0x20 && byte <= 0x7E)
            text += field[i];
        else
            text += fmt::format("\\x{:02X}", byte);
    }
    if (field.size() > quoted_characters)
        text += "...";
    return text;
}

std::vector<std::string_view> split_fields(std::string_view line) {
    std::vector<std::string_view> fields;
    while (true) {
        const auto comma = line.find(',');
        fields.push_back(trim(line.substr(0, comma)));
        if (comma == std::string_view::npos)
            return fields;
        line.remove_prefix(comma + 1);
    }
}

std::optional<Column> column_named(std::string_view name) {
    for (const auto& entry : column_names) {
        if (entry.name == name)
            return entry.column;
    }
    return std::nullopt;
}

std::string_view name_of(Column column) {
    for (const auto& entry : column_names) {
        if (entry.column == column)
            return entry.name;
    }
    return {};
}

/// The columns of the file, from its header line; error empty when the header is usable.
struct Header {
    std::vector<Column> columns;
    std::string error;
};

Header read_header(std::string_view line, int line_number) {
    Header header;
    for (const auto field : split_fields(line)) {
        const auto column = column_named(field);
        if (!column) {
            header.error = fmt::format("line {}: unknown column {}", line_number, quoted(field));
            return header;
        }
        for (const auto seen : header.columns) {
            if (seen == *column) {
                header.error = fmt::format("line {}: column {} given twice", line_number, field);
                return header;
            }
        }
        header.columns.push_back(*column);
    }
    for (const auto& entry : column_names) {
        bool found = false;
        for (const auto seen : header.columns)
            found = found || seen == entry.column;
        if (!found) {
            header.error = fmt::format("line {}: missing column {}", line_number, entry.name);
            return header;
        }
    }
    return header;
}

/// The finite number a field holds, or the reason it holds none.
struct Value {
    double number = 0.0;
    std::string error;
};

Value parse_value(std::string_view text, int line_number, Column column) {
    if (text.empty()) {
        return {0.0,
                fmt::format("line {}: empty value in column {}", line_number, name_of(column))};
    }
    double number = 0.0;
    const auto end = text.data() + text.size();
    const auto [stop, status] = std::from_chars(text.data(), end, number);
    if (status != std::errc{} || stop != end) {
        return {0.0, fmt::format("line {}: '{}' is not a number", line_number, quoted(text))};
    }
    if (!std::isfinite(number)) {
        return {0.0,
                fmt::format("line {}: '{}' is not a finite number", line_number, quoted(text))};
    }
    return {number, {}};
}

void assign(AtmosphereRow& row, Column column, double value) {
    switch (column) {
        case Column::altitude:
            row.altitude_m = value;
            break;
        case Column::density:
            row.density_kg_m3 = value;
            break;
        case Column::temperature:
            row.temperature_K = value;
            break;
    }
}

}  // namespace

AtmosphereCsv read_atmosphere_csv(const std::filesystem::path& file) {
    std::string error;
    const std::optional<std::string> text =
        read_text_file(file, most_table_file_bytes, "an atmosphere table", &error);
    if (!text) {
        AtmosphereCsv table;
        table.error = fmt::format("cannot open the file: {}", error);
        return table;
    }
    return parse_atmosphere_csv(*text);
}

AtmosphereCsv parse_atmosphere_csv(std::string_view csv) {
    AtmosphereCsv table;
    std::optional<Header> header;
    std::istringstream in{std::string(csv)};
    std::string text;
    int line_number = 0;
    while (std::getline(in, text)) {
        ++line_number;
        std::string_view line = text;
        if (line_number == 1 && line.starts_with(byte_order_mark)) {
            line.remove_prefix(byte_order_mark.size());
        }
        line = trim(line);
        if (line.empty() || line.front() == '#')
            continue;

        if (!header) {
            header = read_header(line, line_number);
            if (!header->error.empty()) {
                table.error = header->error;
                return table;
            }
            continue;
        }

        const auto fields = split_fields(line);
        const auto& columns = header->columns;
        if (fields.size() > columns.size()) {
            table.error = fmt::format("line {}: {} values for {} columns", line_number,
                                      fields.size(), columns.size());
            return table;
        }
        AtmosphereRow row;
        for (std::size_t i = 0; i < columns.size(); ++i) {
            if (i >= fields.size()) {
                table.error =
                    fmt::format("line {}: missing column {}", line_number, name_of(columns[i]));
                return table;
            }
            const auto value = parse_value(fields[i], line_number, columns[i]);
            if (!value.error.empty()) {
                table.error = value.error;
                return table;
            }
            assign(row, columns[i], value.number);
        }
        if (table.rows.size() == most_table_rows) {
            table.error = fmt::format("line {}: more than {} rows, the most a table may have",
                                      line_number, most_table_rows);
            return table;
        }
        table.rows.push_back(row);
        table.lines.push_back(line_number);
    }

    if (!header) {
        table.error = "no header line naming the columns altitude_m, density_kg_m3, temperature_K";
    }
    return table;
}

}  // namespace ds
