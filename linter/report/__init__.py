"""Reports: the result model, and one writer module per output format."""
