"""Fill-in templates generated from a contract: a validated workbook, or a header-only CSV."""
