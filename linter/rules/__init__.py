"""Rule families: one module per family; each declares its rules and the inspectors that find them."""
