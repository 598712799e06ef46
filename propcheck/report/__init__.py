"""Report stage: build the report data once, then write each format."""

from propcheck.report.data import ReportData, build_report_data
from propcheck.report.write import write_reports

__all__ = ["ReportData", "build_report_data", "write_reports"]
