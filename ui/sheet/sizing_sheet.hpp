#pragma once

#include <string>

#include <QDateTime>
#include <QString>

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

struct StudyOutcome;

/// What a sheet says about where it came from.
struct SheetContext {
    QString toolVersion;
    QDateTime date;
    QString designFile;  ///< may be empty for an unsaved design
    /// A trade study of this design to include, when one was run; not owned.
    const StudyOutcome* trade = nullptr;
    /// The key figure the trade study's charts show ("peak_deceleration").
    std::string tradeFigure = "peak_deceleration";
};

/// The sizing sheet as one HTML document: title, design name, date, tool version, the caution,
/// the inputs with units, the key figures, the mass budget with growth allowances, the
/// timeline, every check, the charts (PNG images embedded as data), and the trade study when
/// the context has one.
QString sheetHtml(const Design& design, const Results& results, const SheetContext& context);

/// The trajectory history as CSV, one row per sample, a header naming each column with its unit.
QString historyCsv(const Results& results);

/// Writes the sheet by the file's extension: .pdf, .html or .csv. Atomic: the file is written
/// whole or not at all. Returns false with the reason in `error`.
bool writeSheet(const QString& path, const Design& design, const Results& results,
                const SheetContext& context, QString* error);

}  // namespace ds
