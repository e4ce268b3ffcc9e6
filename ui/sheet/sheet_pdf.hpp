#pragma once

#include <functional>

#include <QFont>
#include <QIODevice>
#include <QString>

QT_BEGIN_NAMESPACE
class QTextDocument;
QT_END_NAMESPACE

#include "sheet/sheet_charts.hpp"

namespace ds::sheet {

/// The HTML to lay out, given how its images are named and how wide charts are drawn.
using PagedHtml = std::function<QString(const ImageSource& source, int chartWidth)>;

/// The font the PDF's text is laid out in: DejaVu Sans, set without ligatures.
QFont sheetFont();

/// Moves every heading that would end a page, with too little of what it heads after it, to
/// the top of the next page (a page break before it). The document must be paginated (its
/// page size set). Returns how many headings were moved.
int keepHeadingsWithWhatFollows(QTextDocument& document);

/// Lays HTML out on A4 pages, at screen resolution so that pixel sizes mean what they mean in
/// the HTML, with "<title> — page i of n" at the foot of every page: the sheet as a PDF. The
/// images are handed to the layout as resources. Returns false when the device cannot be
/// painted on.
bool writePagedPdf(QIODevice& device, const QString& title, const QString& creator,
                   const PagedHtml& html);

}  // namespace ds::sheet
