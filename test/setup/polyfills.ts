// Loaded by vitest before every suite; see language/polyfills/object-group-by.cjs for why.
import '../../language/polyfills/object-group-by.cjs';
