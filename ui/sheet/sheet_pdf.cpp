#include "sheet/sheet_pdf.hpp"

#include <algorithm>
#include <cmath>

#include <QAbstractTextDocumentLayout>
#include <QFont>
#include <QPageLayout>
#include <QPageSize>
#include <QPainter>
#include <QPdfWriter>
#include <QTextBlock>
#include <QTextCursor>
#include <QTextDocument>
#include <QTextLayout>
#include <QTextTable>
#include <QUrl>

namespace ds::sheet {
namespace {

/// Width the charts are shown at in the PDF, in its layout pixels (96 per inch): the A4 text
/// width less a little.
constexpr int pdfChartWidth = 660;
/// The PDF is laid out at screen resolution so that pixel sizes mean the same as in the HTML.
constexpr int pdfResolutionDpi = 96;
constexpr double pdfMarginMm = 15.0;
/// Room kept at the foot of each PDF page for the page number (layout pixels).
constexpr double pdfFooterHeight = 24.0;
/// What a heading must have of what it heads beneath it on its page (layout pixels): some
/// four lines of text, or a table's heading row and two rows.
constexpr double leastHeadedHeight = 80.0;

}  // namespace

QFont sheetFont() {
    // Without shaping, Latin text is set glyph for glyph: no "fi" or "fl" ligature, so the
    // PDF's text is found by a search for "coefficient" and copies as it reads.
    QFont font(QStringLiteral("DejaVu Sans"));
    font.setStyleStrategy(QFont::PreferNoShaping);
    return font;
}

int keepHeadingsWithWhatFollows(QTextDocument& document) {
    const double pageHeight = document.pageSize().height();
    if (!(pageHeight > 0.0))
        return 0;
    QAbstractTextDocumentLayout* layout = document.documentLayout();
    int moved = 0;
    for (QTextBlock block = document.begin(); block.isValid(); block = block.next()) {
        if (block.blockFormat().headingLevel() == 0 ||
            block.blockFormat().pageBreakPolicy() & QTextFormat::PageBreak_AlwaysBefore)
            continue;
        // Laid out afresh after each move: everything below it moved too.
        const QRectF heading = layout->blockBoundingRect(block);
        const double pageTop = std::floor(heading.top() / pageHeight) * pageHeight;
        if (heading.top() - pageTop < 1.0)
            continue;  // at the top of its page already
        const double roomBelow = pageTop + pageHeight - heading.bottom();
        // What follows: the next block's top (a table's first cell) decides whether it was
        // pushed to the next page; the room left whether enough of it fits beneath.
        const QTextBlock next = block.next();
        if (!next.isValid())
            continue;
        QRectF following = layout->blockBoundingRect(next);
        if (QTextTable* table = QTextCursor(next).currentTable())
            following = layout->frameBoundingRect(table);
        else if (next.layout() && next.layout()->lineCount() > 0)
            // A line that does not fit (an image's) is moved down to the next page, and the
            // block's top stays behind it: where its first line stands is what counts.
            following.setTop(following.top() + next.layout()->lineAt(0).y());
        const bool followsOnNextPage = following.top() >= pageTop + pageHeight;
        const double needed = std::min(leastHeadedHeight, following.height());
        if (followsOnNextPage || roomBelow < needed) {
            QTextBlockFormat format;
            format.setPageBreakPolicy(QTextFormat::PageBreak_AlwaysBefore);
            QTextCursor(block).mergeBlockFormat(format);
            ++moved;
        }
    }
    return moved;
}

bool writePagedPdf(QIODevice& device, const QString& title, const QString& creator,
                   const PagedHtml& html) {
    QPdfWriter writer(&device);
    writer.setResolution(pdfResolutionDpi);
    writer.setPageLayout(QPageLayout(QPageSize(QPageSize::A4), QPageLayout::Portrait,
                                     QMarginsF(pdfMarginMm, pdfMarginMm, pdfMarginMm, pdfMarginMm),
                                     QPageLayout::Millimeter));
    writer.setTitle(title);
    writer.setCreator(creator);

    QTextDocument document;
    document.setDefaultFont(sheetFont());
    document.documentLayout()->setPaintDevice(&writer);
    const ImageSource resource = [&document](std::size_t index, const QImage& image) {
        const QString name = QStringLiteral("chart%1.png").arg(index + 1);
        document.addResource(QTextDocument::ImageResource, QUrl(name), image);
        return name;
    };
    document.setHtml(html(resource, pdfChartWidth));
    const QSizeF page(writer.width(), writer.height() - pdfFooterHeight);
    document.setPageSize(page);
    keepHeadingsWithWhatFollows(document);

    QPainter painter;
    if (!painter.begin(&writer))
        return false;
    const int pages = document.pageCount();
    for (int i = 0; i < pages; ++i) {
        if (i > 0)
            writer.newPage();
        painter.save();
        painter.translate(0.0, -i * page.height());
        document.drawContents(&painter, QRectF(QPointF(0.0, i * page.height()), page));
        painter.restore();
        const QRectF foot(0.0, page.height(), page.width(), pdfFooterHeight);
        painter.setPen(Qt::darkGray);
        painter.drawText(foot, Qt::AlignRight | Qt::AlignBottom,
                         QStringLiteral("%1 — page %2 of %3")
                             .arg(title, QString::number(i + 1), QString::number(pages)));
    }
    return painter.end();
}

}  // namespace ds::sheet
