#pragma once

#include <QObject>

class QWidget;

namespace ds {

/// Keeps the mouse wheel from changing a drop-down box (or a spin box) that the user is only
/// scrolling past: without focus the widget lets the wheel go on to the form that scrolls.
/// Guarded widgets take focus by click or tab only, so a wheel over them never focuses them.
void guardWheel(QWidget* widget);

}  // namespace ds
