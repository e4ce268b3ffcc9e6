#include "views/wheel_guard.hpp"

#include <QCoreApplication>
#include <QEvent>
#include <QWidget>

namespace ds {
namespace {

class WheelGuard : public QObject {
public:
    using QObject::QObject;

protected:
    bool eventFilter(QObject* watched, QEvent* event) override {
        if (event->type() != QEvent::Wheel)
            return false;
        const auto* widget = qobject_cast<QWidget*>(watched);
        if (!widget || widget->hasFocus())
            return false;
        // Not delivered here, and not accepted: the application hands it to the parents, and
        // the scroll area scrolls.
        event->ignore();
        return true;
    }
};

WheelGuard* theGuard() {
    static auto* guard = new WheelGuard(QCoreApplication::instance());
    return guard;
}

}  // namespace

void guardWheel(QWidget* widget) {
    widget->setFocusPolicy(Qt::StrongFocus);
    widget->installEventFilter(theGuard());
}

}  // namespace ds
