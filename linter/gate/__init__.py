"""Gatekeeping: the pre-commit hook, the inbox gate and the submission ledger."""
