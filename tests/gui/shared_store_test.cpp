// The editor on a case in the laboratory's shared store (PostgreSQL), against a real server: it
// opens the case from the same address the command line takes, commits each edit there with the
// database role in the audit row, shows and verifies the history, and issues a signed report
// whose seal the database keeps; a second examiner's edit in between is refused naming it; a
// reader sees the case read-only; a role that is not a member cannot open it. Needs a server
// (scripts/pg-cluster sets COUNTERPOISE_TEST_POSTGRES=1); without one every test is skipped.

#include <QFile>
#include <QLabel>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>

#include "app/editor/case_document.hpp"
#include "app/editor/editor_settings.hpp"
#include "app/editor/history_panel.hpp"
#include "app/editor/item_form.hpp"
#include "app/editor/main_window.hpp"
#include "app/editor/probability_editor.hpp"
#include "app/editor/report_service.hpp"
#include "core/platform/sha256.hpp"
#include "core/reading/json_text.hpp"
#include "core/store/anchor_check.hpp"
#include "core/store/case_store.hpp"
#include "core/store/database_case.hpp"
#include "core/store/examiner_key.hpp"
#include "core/store/report_anchor.hpp"
#include "editor_test_support.hpp"
#include "tests/core/store/postgres_test_setup.hpp"

#include <QTableWidget>
#include <QTableView>
#include <unistd.h>

using namespace counterpoise;
using editor::MainWindow;
using namespace counterpoise::editor_test;

namespace {

const store::ExaminerName kTarrant("Dr Imogen Tarrant");  // the demo case's examiner (invented)
const store::ExaminerName kPryce("Dr Owen Pryce");        // a colleague (invented)

// A new case reference for this test program.
std::string fresh_reference(const char* what) {
  return std::string("HV-2026-0117/gui-") + what + "-" + std::to_string(::getpid());
}

// The address the editor and the command line take, connecting as `role`; host and port come
// from the PG environment (the test cluster's socket).
QString address_as(const char* role, const std::string& reference) {
  const QByteArray database = qgetenv("PGDATABASE");
  return QString("postgresql://%1@/%2?case=%3").arg(role, QString::fromUtf8(database), QString::fromStdString(reference));
}

// The same case, as the core opens it on its own (libpq key=value form).
store::DatabaseCase core_address(const char* role, const std::string& reference) {
  return {std::string("user=") + role, reference};
}

// Imports the demo break-in case into the database as the examiner role.
void import_demo(const std::string& reference) {
  const auto document = reading::read_json_file(kBreakIn.toStdString());
  store::CaseStore::create(core_address(store_test::kExaminerRole, reference), document, kTarrant);
}

}  // namespace

class SharedStoreTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    if (!store_test::postgres_configured())
      QSKIP("no PostgreSQL test server configured (eval \"$(scripts/pg-cluster start)\" before ctest)");
    QStandardPaths::setTestModeEnabled(true);
    QCoreApplication::setOrganizationName("CounterpoiseTest");
    QCoreApplication::setApplicationName("counterpoise-test-shared");
    editor::settings::set_examiner_name(QString::fromStdString(kTarrant.text()));
    store_test::prepare_postgres();
    QVERIFY(temp_.isValid());
  }

  // Open from the address, edit through the form, see the row in the database (the database
  // role as its account), verify the history, issue a signed report: the seal and the report's
  // bytes are in the database, and the store checks against the PDF as `verify --against` does.
  void editSealAndHistoryInTheDatabase() {
    const std::string reference = fresh_reference("edit");
    import_demo(reference);
    QTemporaryDir keys;
    const KeyFolder folder(keys.path());
    const auto public_key = store::create_examiner_key(keys.path().toStdString(), kTarrant);

    MainWindow window;
    window.show();
    const QString address = address_as(store_test::kExaminerRole, reference);
    QCOMPARE(window.openPath(address), QString());
    QVERIFY(window.document()->inDatabase());
    QCOMPARE(window.document()->fileKind(), editor::FileKind::case_store);
    QVERIFY2(!window.document()->readOnly(), qPrintable(window.document()->readOnlyReason()));
    QVERIFY(window.windowTitle().contains(QString::fromStdString(reference)));
    // The status bar says where the edits go: the shared store, not a case file.
    QCOMPARE(window.findChild<QLabel*>("statusFile")->text(), QString("Shared store: every edit saved"));

    window.selectItem("E4");
    window.showTab(MainWindow::FindingsTab);
    retype(window.itemForm()->probabilityEditor(true)->pointField(), "0.9");
    QVERIFY(!window.document()->modified());  // committed, nothing waits to be saved
    {
      const auto stored = store::CaseStore::open(core_address(store_test::kExaminerRole, reference), store::OpenMode::read_only);
      QCOMPARE(stored.state().value_at(store::EntityRef::item("E4"), "p_given_hp"), std::optional<nlohmann::json>(0.9));
      const auto last = stored.audit_rows().back();
      QCOMPARE(last.account, std::optional<std::string>(store_test::kExaminerRole));
      QCOMPARE(last.examiner, kTarrant.text());
    }

    window.showTab(MainWindow::HistoryTab);
    QVERIFY(window.historyPanel()->verifyNow());
    QCOMPARE(window.historyPanel()->auditTable()->rowCount(), 2);

    if (!window.reportsAvailable()) QSKIP("built without the report module");
    const auto signing = window.chooseSealSigning();
    QVERIFY(signing && signing->key);
    const QString pdf = temp_.filePath("shared.pdf");
    QCOMPARE(window.issueReport(pdf, *signing), QString());
    const auto stored = store::CaseStore::open(core_address(store_test::kExaminerRole, reference), store::OpenMode::read_only);
    const auto seal = stored.latest_seal();
    QVERIFY(seal && seal->signed_seal());
    QCOMPARE(seal->public_key, public_key.hex());
    QCOMPARE(seal->report_sha256, platform::sha256_hex(file_bytes(pdf)));
    QCOMPARE(stored.audit_rows().back().account, std::optional<std::string>(store_test::kExaminerRole));
    const auto check = store::check_against_report(stored, store::read_report_anchor(file_bytes(pdf), "shared.pdf"),
                                                   file_bytes(pdf));
    QVERIFY2(check.ok(), check.problem ? check.problem->c_str() : "");
    QVERIFY(window.historyPanel()->verifyNow());
  }

  // Another examiner commits an edit while the case is open in the editor: the editor's next
  // edit is refused, naming who changed what, and nothing of either is lost.
  void staleEditIsRefusedNamingTheOtherChange() {
    const std::string reference = fresh_reference("stale");
    import_demo(reference);
    store_test::add_case_member(reference, store_test::kColleagueRole, store::member_role::examiner);
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(address_as(store_test::kExaminerRole, reference)), QString());
    {
      auto colleague = store::CaseStore::open(core_address(store_test::kColleagueRole, reference), store::OpenMode::edit);
      colleague.set_field(kPryce, store::EntityRef::item("E1"), "title", nlohmann::json("Glass on the jacket (re-examined)"));
    }
    QSignalSpy failed(window.document(), &editor::CaseDocument::editFailed);
    window.selectItem("E4");
    window.showTab(MainWindow::FindingsTab);
    retype(window.itemForm()->probabilityEditor(true)->pointField(), "0.9");
    QTRY_COMPARE(failed.count(), 1);
    const QString message = failed.at(0).at(0).toString();
    QVERIFY2(message.contains("Dr Owen Pryce (account cp_test_colleague)"), qPrintable(message));
    QVERIFY2(message.contains("set item E1 field title"), qPrintable(message));
    const auto stored = store::CaseStore::open(core_address(store_test::kExaminerRole, reference), store::OpenMode::read_only);
    QCOMPARE(stored.audit_rows().size(), std::size_t(3));  // import, membership, colleague's edit
    QCOMPARE(stored.state().value_at(store::EntityRef::item("E1"), "title"),
             std::optional<nlohmann::json>("Glass on the jacket (re-examined)"));
    QVERIFY(stored.verify().ok());
  }

  // The History tab shows each audit row's database role, the account the database itself
  // records (current_user, enforced by the store's row policy): the import row the examiner's,
  // the membership row the examiner's, a colleague's edit the colleague's; the same, row for row,
  // as the core reads the rows on its own.
  void historyShowsEachRowsDatabaseRole() {
    const std::string reference = fresh_reference("roles");
    import_demo(reference);
    store_test::add_case_member(reference, store_test::kColleagueRole, store::member_role::examiner);
    {
      auto colleague = store::CaseStore::open(core_address(store_test::kColleagueRole, reference), store::OpenMode::edit);
      colleague.set_field(kPryce, store::EntityRef::item("E1"), "title", nlohmann::json("Glass on the jacket (re-examined)"));
    }
    MainWindow window;
    window.show();
    QCOMPARE(window.openPath(address_as(store_test::kExaminerRole, reference)), QString());
    window.showTab(MainWindow::HistoryTab);
    auto* audit = window.historyPanel()->auditTable();
    const auto rows =
        store::CaseStore::open(core_address(store_test::kExaminerRole, reference), store::OpenMode::read_only).audit_rows();
    QCOMPARE(rows.size(), std::size_t(3));  // import, membership, colleague's edit
    QTRY_COMPARE(audit->rowCount(), 3);
    QVERIFY(!audit->isColumnHidden(editor::HistoryPanel::AccountColumn));
    QCOMPARE(audit->horizontalHeaderItem(editor::HistoryPanel::AccountColumn)->text(), QString("Database role"));
    // Newest first: the colleague's edit, the membership, the import.
    QCOMPARE(audit->item(0, editor::HistoryPanel::AccountColumn)->text(), QString(store_test::kColleagueRole));
    QCOMPARE(audit->item(0, editor::HistoryPanel::ExaminerColumn)->text(), QString::fromStdString(kPryce.text()));
    QCOMPARE(audit->item(1, editor::HistoryPanel::AccountColumn)->text(), QString(store_test::kExaminerRole));
    QCOMPARE(audit->item(2, editor::HistoryPanel::AccountColumn)->text(), QString(store_test::kExaminerRole));
    for (int row = 0; row < 3; ++row) {
      const auto& stored = rows[rows.size() - 1 - static_cast<std::size_t>(row)];
      QVERIFY(stored.account);
      QCOMPARE(audit->item(row, editor::HistoryPanel::AccountColumn)->text(), QString::fromStdString(*stored.account));
    }
  }

  // A reader of the case sees it read-only, told why; a role that is not a member cannot open it.
  void readerReadsOnlyAndOutsiderIsRefused() {
    const std::string reference = fresh_reference("reader");
    import_demo(reference);
    store_test::add_case_member(reference, store_test::kReaderRole, store::member_role::reader);
    MainWindow reader;
    QCOMPARE(reader.openPath(address_as(store_test::kReaderRole, reference)), QString());
    QVERIFY(reader.document()->readOnly());
    QVERIFY2(reader.document()->readOnlyReason().contains("a reader of this case"),
             qPrintable(reader.document()->readOnlyReason()));
    QCOMPARE(reader.findChild<QLabel*>("statusFile")->text(), QString("Shared store, read-only"));

    MainWindow outsider;
    const QString refused = outsider.openPath(address_as(store_test::kOutsiderRole, reference));
    QVERIFY2(refused.contains("may read"), qPrintable(refused));
    QVERIFY(!outsider.document()->inDatabase());
  }

 private:
  QTemporaryDir temp_;
};

QTEST_MAIN(SharedStoreTest)
#include "shared_store_test.moc"
