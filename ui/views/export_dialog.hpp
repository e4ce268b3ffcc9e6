#pragma once

#include <functional>

#include <QFileDialog>
#include <QMessageBox>
#include <QString>
#include <QWidget>

namespace ds {

/// Asks where to export, then exports there with `exportTo`; a failed export is shown in a
/// warning titled `warningTitle`. Nothing happens when the dialog is cancelled.
inline void exportThroughDialog(QWidget* parent, const QString& dialogTitle,
                                const QString& warningTitle, const QString& directory,
                                const QString& filter,
                                const std::function<bool(const QString&, QString*)>& exportTo) {
    const QString path = QFileDialog::getSaveFileName(parent, dialogTitle, directory, filter);
    if (path.isEmpty())
        return;
    QString error;
    if (!exportTo(path, &error))
        QMessageBox::warning(parent, warningTitle, error);
}

}  // namespace ds
