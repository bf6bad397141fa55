; A block folds from its header to its closing brace.
(block) @fold
