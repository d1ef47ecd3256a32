"""Design searches on the plain-float path: lightest section, splice positions, splice layout."""
