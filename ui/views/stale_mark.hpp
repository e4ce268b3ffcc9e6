#pragma once

#include <QtGlobal>

QT_BEGIN_NAMESPACE
class QTableWidget;
QT_END_NAMESPACE

namespace ds {

/// Greys and slants every cell of a results table while its results are stale (of a design
/// before the one on show: a field refused a value, or the design does not read); the
/// header's tooltip says why. Called again after the table is refilled.
void showStale(QTableWidget* table, bool stale);

}  // namespace ds
