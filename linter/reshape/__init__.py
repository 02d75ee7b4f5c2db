"""Reshaping a table by a recipe of declarative steps, with provenance and a value-conservation audit.

Entry points: `recipe.Recipe` / `load_recipe` / `dump_recipe`, `apply.apply_recipe`,
`audit.audit`, `tidy.tidy_with_recipe` (both at once), `codegen.pandas_code`,
`write.write_tidy`; new steps register through `steps.register_sheet_step`.
"""
