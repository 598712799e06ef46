"""report.html in a real browser: headless Chromium driven by chromedriver (Debian packages).

Skips when Chromium or chromedriver is missing, except under CI (CI=true),
where a missing browser is a failure: .ci/run installs them.
"""

from __future__ import annotations

import os
import shutil
import tempfile
from pathlib import Path

import pytest

from tests.conftest import REPO, SAMPLE_DB

ACTUAL = REPO / "tests" / "actual"  # git-ignored
CHROME_FLAGS = ("--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
                "--disable-component-update", "--disable-sync", "--window-size=1400,1000")


def _find(*names: str) -> str | None:
    for name in names:
        found = shutil.which(name)
        if found:
            return found
    return None


@pytest.fixture(scope="module")
def browser():
    chromium = _find("chromium", "chromium-browser", "google-chrome")
    driver_path = _find("chromedriver")
    try:
        from selenium import webdriver
        from selenium.webdriver.chrome.service import Service
    except ImportError:
        webdriver = None
    if not (chromium and driver_path and webdriver):
        missing = "selenium" if webdriver is None else "chromium/chromedriver"
        if os.environ.get("CI") == "true":
            pytest.fail(f"{missing} missing under CI (.ci/run installs chromium and chromium-driver)")
        pytest.skip(f"{missing} not installed")
    profile = tempfile.mkdtemp(prefix="propcheck-chromium-")
    options = webdriver.ChromeOptions()
    options.binary_location = chromium
    for flag in CHROME_FLAGS:
        options.add_argument(flag)
    options.add_argument(f"--user-data-dir={profile}")
    options.set_capability("goog:loggingPrefs", {"browser": "ALL"})
    driver = webdriver.Chrome(service=Service(executable_path=driver_path), options=options)
    try:
        yield driver
    finally:
        driver.quit()
        shutil.rmtree(profile, ignore_errors=True)


@pytest.fixture(scope="module")
def report(tmp_path_factory):
    from propcheck.cli import main

    out = tmp_path_factory.mktemp("browser-report")
    assert main(["check", str(SAMPLE_DB), "--out", str(out), "--quiet"]) == 1  # the demo delivery has errors
    return out / "report.html"


def test_report_in_headless_chromium(browser, report):
    from selenium.webdriver.common.by import By
    from selenium.webdriver.support.ui import Select

    browser.get(Path(report).resolve().as_uri())
    assert "Property data audit" in browser.title

    rows = browser.find_elements(By.CSS_SELECTOR, "#findings tbody tr")
    total = len(rows)
    assert total > 5
    visible = lambda: [r for r in browser.find_elements(By.CSS_SELECTOR, "#findings tbody tr") if r.is_displayed()]  # noqa: E731
    assert len(visible()) == total

    # the rule filter narrows the table to that rule's rows, and the counter follows
    rule = rows[-1].get_attribute("data-rule")
    Select(browser.find_element(By.ID, "f-rule")).select_by_value(rule)
    narrowed = visible()
    assert 0 < len(narrowed) < total
    assert {r.get_attribute("data-rule") for r in narrowed} == {rule}
    assert browser.find_element(By.ID, "shown").text == str(len(narrowed))
    Select(browser.find_element(By.ID, "f-rule")).select_by_value("")

    # the compound filter narrows it too
    box = browser.find_element(By.ID, "f-compound")
    box.send_keys("LPC-0020")
    assert 0 < len(visible()) < total
    box.clear()
    box.send_keys(" ")  # fires input; nothing matches a blank id
    box.clear()

    # sorting by a column reorders the rows
    header = browser.find_element(By.XPATH, "//table[@id='findings']/thead/tr/th[4]")
    header.click()
    ids = [r.get_attribute("data-compound") for r in browser.find_elements(By.CSS_SELECTOR, "#findings tbody tr")]
    assert ids == sorted(ids)
    assert header.get_attribute("aria-sort") == "ascending"

    # a compound panel holds a rendered matplotlib plot with drawn paths
    panel = browser.find_element(By.CSS_SELECTOR, ".panel svg")
    assert panel.size["width"] > 200 and panel.size["height"] > 100
    assert len(browser.find_elements(By.CSS_SELECTOR, ".panel svg path")) > 10
    assert browser.find_elements(By.CSS_SELECTOR, ".family svg")

    severe = [e for e in browser.get_log("browser") if e["level"] in ("SEVERE", "ERROR")]
    assert not severe, severe

    ACTUAL.mkdir(parents=True, exist_ok=True)
    browser.set_window_size(1400, 1000)
    height = browser.execute_script("return document.body.scrollHeight")
    browser.set_window_size(1400, min(int(height), 6000))
    browser.execute_script("window.scrollTo(0, 0)")
    assert browser.save_screenshot(str(ACTUAL / "report.png"))
    browser.execute_script("document.getElementById('compounds').scrollIntoView()")
    browser.set_window_size(1400, 1000)
    browser.execute_script("document.getElementById('compounds').scrollIntoView()")
    assert browser.save_screenshot(str(ACTUAL / "report-panels.png"))
