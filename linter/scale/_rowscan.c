/* Judge the lines of a plain delimited file straight from its bytes, one pass, no Arrow parse.
 *
 * The companion of linter/scale/row_scan.py, which builds the column specs and says how to read
 * the answers. Like the numpy screen (linter/scale/screen.py) this pass is deliberately stricter
 * than the engine: a cell it passes is one the engine finds nothing in; anything it is not sure
 * of is marked, and any line it cannot split for certain (a quote inside a cell or a doubled one,
 * a byte outside ASCII, a stray carriage return) is handed back whole, to be parsed by Arrow and
 * judged by the numpy screen. A cell quoted whole ("1,420") is read as Arrow reads it: the text
 * between the quotes, delimiters included (an empty quoted cell is null, as in Arrow).
 *
 * judge(data, start, end, delimiter, width, columns, keys, bad, flags, hashes, starts, first_good)
 *   -> rows
 *   data        the bytes (any buffer); lines data[start:end], the last one may lack its '\n'
 *   columns     one tuple per file column: (kind, variable, nullable, low, high, low_ns, high_ns,
 *               table, codes, prefix, missing); kind 0 means the column is not judged; missing
 *               holds the column's missing-value codes, stripped, as bytes
 *   keys        file column indices of the key, in the order their hashes are folded
 *   bad         uint8 [rows x variables], 1 where the variable's cell needs the engine
 *   flags       uint8 [rows]: FALLBACK where the whole line must be parsed and judged by numpy
 *               instead, DOUBT where some cell of it needs the engine, 0 where every cell passes
 *   hashes      uint64 [rows], the key hash (as linter/scale/key_hash.py computes it) of each
 *               line that is not a fallback
 *   starts      int64 [rows + 1], where each line starts in data (and where the last one ends)
 *   first_good  int64 [variables], the first line whose cell passes and is not missing, or -1
 * Raises ValueError on an empty line, or on a line it does not hand back whose field count is
 * not width (or on more lines than lines of that width could make).
 *
 * sorted_high_halves(hashes, out): the upper halves of the uint64 hashes, radix-sorted into out.
 *
 * gather_lines(data, low, high, out) -> size: the byte ranges data[low[i]:high[i]] (int64 arrays
 * of the same length, each range within data) copied one after another into out; the number of
 * bytes copied. Raises ValueError on a range outside data or an out too small.
 */
#define PY_SSIZE_T_CLEAN
#include <Python.h>
#include <stdint.h>
#include <string.h>
#ifdef __SSE2__
#include <emmintrin.h>
#endif

enum kind { SKIP = 0, TEXT = 1, NUMBER = 2, INTEGER = 3, BOOLEAN = 4, DATE = 5 };
enum flag { FALLBACK = 1, DOUBT = 2 };

#define MAX_CODES 64
#define MAX_COLUMNS 256
#define MAX_KEYS 16
#define LONGEST_PLAIN_INTEGER 15
#define LONGEST_PLAIN_NUMBER 31
#define SIGNIFICANT_DIGITS 15
#define FIRST_YEAR 1678
#define LAST_YEAR 2261
#define NS_PER_DAY 86400000000000LL

static const uint64_t FOLD = 0x100000001B3ULL;
static const uint64_t NULL_HASH = 0x9E3779B97F4A7C15ULL;

typedef struct {
    const char *text;
    Py_ssize_t size;
} code_t;

typedef struct {
    code_t codes[MAX_CODES];
    int count;
    uint64_t lengths; /* bit n set when a code is n bytes long (bit 63: 63 or more) */
} code_list_t;

typedef struct {
    int kind;
    int variable; /* index among the judged variables */
    int nullable;
    double low, high;
    long long low_ns, high_ns;
    const unsigned char *table; /* width * 256 bytes, 1 where a byte may stand there; or NULL */
    Py_ssize_t table_width;
    code_list_t codes;
    int has_codes;
    const char *prefix;
    Py_ssize_t prefix_size;
    code_list_t missing;
    int is_key;
    int key_slot; /* where its hash goes among the key's, when it is a key column */
} column_t;

/* What judging one cell told. */
typedef struct {
    int clean;   /* the engine finds nothing in it */
    int good;    /* it passes and is not missing */
    int keyed;   /* its key value is known (when it is a key cell) */
    uint64_t hash;
} cell_t;

static uint64_t mix(uint64_t value) {
    value ^= value >> 30;
    value *= 0xBF58476D1CE4E5B9ULL;
    value ^= value >> 27;
    value *= 0x94D049BB133111EBULL;
    value ^= value >> 31;
    return value;
}

static uint64_t text_hash(const unsigned char *p, Py_ssize_t n) {
    uint64_t hash = (uint64_t)n * FOLD;
    for (Py_ssize_t at = 0; at < n; at += 8) {
        uint64_t word = 0;
        Py_ssize_t take = n - at < 8 ? n - at : 8;
        memcpy(&word, p + at, (size_t)take); /* little-endian, zero-padded */
        hash = mix(hash * FOLD ^ word);
    }
    return hash;
}

static uint64_t double_hash(double value) {
    uint64_t bits;
    value = value + 0.0; /* -0.0 hashes as 0.0 */
    memcpy(&bits, &value, sizeof bits);
    return mix(bits);
}

static int is_code(const code_list_t *list, const unsigned char *p, Py_ssize_t n) {
    if (!((list->lengths >> (n < 63 ? n : 63)) & 1)) {
        return 0; /* no code is that long: most cells are told apart by their length alone */
    }
    for (int i = 0; i < list->count; i++) {
        if (list->codes[i].size == n && memcmp(list->codes[i].text, p, (size_t)n) == 0) {
            return 1;
        }
    }
    return 0;
}

static const double POWERS[] = {1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16};

/* A plain number (optional leading sign, digits, for numbers at most one dot, a digit somewhere,
 * at most 15 digits): its value, exact as every correctly rounding parser reads it (the digits
 * fit in 53 bits and one division by an exact power of ten rounds once). */
static int plain_number(const unsigned char *p, Py_ssize_t n, int integer, double *value) {
    if (n > (integer ? LONGEST_PLAIN_INTEGER : LONGEST_PLAIN_NUMBER)) {
        return 0;
    }
    Py_ssize_t at = 0;
    int negative = 0;
    if (p[0] == '+' || p[0] == '-') {
        negative = p[0] == '-';
        at = 1;
    }
    uint64_t digits = 0;
    int count = 0, after_dot = 0, dots = 0;
    for (; at < n; at++) {
        unsigned char c = p[at];
        if (c >= '0' && c <= '9') {
            digits = digits * 10 + (uint64_t)(c - '0');
            count++;
            after_dot += dots;
        } else if (c == '.' && !integer && !dots) {
            dots = 1;
        } else {
            return 0;
        }
    }
    if (count == 0 || count > SIGNIFICANT_DIGITS) {
        return 0;
    }
    double magnitude = after_dot ? (double)digits / POWERS[after_dot] : (double)digits;
    *value = negative ? -magnitude : magnitude;
    return 1;
}

static const int MONTH_DAYS[] = {0, 31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};

static long long days_since_1970(long long year, long long month, long long day) {
    year -= month <= 2;
    long long era = (year >= 0 ? year : year - 399) / 400;
    long long of_era = year - era * 400;
    long long of_year = (153 * ((month + 9) % 12) + 2) / 5 + day - 1;
    return era * 146097 + of_era * 365 + of_era / 4 - of_era / 100 + of_year - 719468;
}

/* Exactly YYYY-MM-DD in ASCII digits, a real day of a real month, a year the ns clock holds. */
static int iso_date(const unsigned char *p, Py_ssize_t n, long long *ns) {
    if (n != 10 || p[4] != '-' || p[7] != '-') {
        return 0;
    }
    static const int at[] = {0, 1, 2, 3, 5, 6, 8, 9};
    int d[8];
    for (int i = 0; i < 8; i++) {
        unsigned char c = p[at[i]];
        if (c < '0' || c > '9') {
            return 0;
        }
        d[i] = c - '0';
    }
    int year = d[0] * 1000 + d[1] * 100 + d[2] * 10 + d[3];
    int month = d[4] * 10 + d[5];
    int day = d[6] * 10 + d[7];
    if (year < FIRST_YEAR || year > LAST_YEAR || month < 1 || month > 12 || day < 1) {
        return 0;
    }
    int leap = (year % 4 == 0) && ((year % 100 != 0) || (year % 400 == 0));
    if (day > MONTH_DAYS[month] + (month == 2 && leap)) {
        return 0;
    }
    *ns = days_since_1970(year, month, day) * NS_PER_DAY;
    return 1;
}

static int boolean_word(const unsigned char *p, Py_ssize_t n, int *truth) {
    char lower[6];
    if (n > 5) {
        return 0;
    }
    for (Py_ssize_t i = 0; i < n; i++) {
        lower[i] = (char)((p[i] >= 'A' && p[i] <= 'Z') ? p[i] + 32 : p[i]);
    }
    if ((n == 4 && memcmp(lower, "true", 4) == 0) || (n == 1 && lower[0] == '1')) {
        *truth = 1;
        return 1;
    }
    if ((n == 5 && memcmp(lower, "false", 5) == 0) || (n == 1 && lower[0] == '0')) {
        *truth = 0;
        return 1;
    }
    return 0;
}

/* Printable ASCII but the space: no trimming function removes such a byte. */
static int untrimmed(unsigned char c) { return c >= 0x21 && c <= 0x7E; }

static cell_t judge_cell(const column_t *col, const unsigned char *p, Py_ssize_t n) {
    cell_t cell = {0, 0, 0, NULL_HASH};
    int nullable = col->nullable && !col->is_key;
    if (n == 0) { /* an empty cell is null: missing */
        cell.clean = nullable;
        cell.keyed = 1;
        return cell;
    }
    /* The text as the engine trims it (for the missing-value codes, numbers and booleans): spaces
     * and tabs are whitespace to every trimming function, printable ASCII never; any other byte
     * at an end of what is left and the engine says. */
    Py_ssize_t low = 0, high = n;
    while (low < high && (p[low] == ' ' || p[low] == '\t')) {
        low++;
    }
    while (high > low && (p[high - 1] == ' ' || p[high - 1] == '\t')) {
        high--;
    }
    if (low < high && (!untrimmed(p[low]) || !untrimmed(p[high - 1]))) {
        return cell;
    }
    const unsigned char *t = p + low;
    Py_ssize_t tn = high - low;
    if (is_code(&col->missing, t, tn)) {
        cell.clean = nullable;
        cell.keyed = 1;
        return cell;
    }
    int passes = 0;
    switch (col->kind) {
    case NUMBER:
    case INTEGER: {
        double value;
        if (tn == 0) {
            return cell;
        }
        if (col->prefix_size && tn >= col->prefix_size && memcmp(t, col->prefix, (size_t)col->prefix_size) == 0) {
            return cell;
        }
        if (!plain_number(t, tn, col->kind == INTEGER, &value)) {
            return cell;
        }
        passes = value >= col->low && value <= col->high;
        cell.keyed = 1;
        cell.hash = col->is_key ? double_hash(value) : 0;
        break;
    }
    case DATE: { /* the agreed form is matched on the text as written, as the engine does */
        long long ns;
        if (!iso_date(p, n, &ns)) {
            return cell;
        }
        passes = ns >= col->low_ns && ns <= col->high_ns;
        cell.keyed = 1;
        cell.hash = col->is_key ? mix((uint64_t)ns) : 0;
        break;
    }
    case BOOLEAN: {
        int truth;
        if (!boolean_word(t, tn, &truth)) {
            return cell;
        }
        passes = 1;
        cell.keyed = 1;
        cell.hash = mix((uint64_t)truth);
        break;
    }
    default: { /* TEXT: codes, pattern and key are the text as written */
        passes = 1;
        if (col->has_codes) {
            passes = is_code(&col->codes, p, n);
        }
        if (passes && col->table != NULL) {
            if (n != col->table_width) {
                passes = 0;
            } else {
                for (Py_ssize_t i = 0; i < n && passes; i++) {
                    passes = col->table[i * 256 + p[i]];
                }
            }
        }
        cell.keyed = 1;
        if (col->is_key) {
            cell.hash = text_hash(p, n);
        }
        break;
    }
    }
    cell.clean = passes;
    cell.good = passes;
    return cell;
}

/* The pass over a run of lines. Only a few bytes matter to it (the delimiter, line feeds, quotes,
 * carriage returns, bytes outside ASCII): with SSE2 they are found 16 bytes at a time, and each
 * is an event in file order; every other byte is skipped. */
typedef struct {
    const unsigned char *bytes;
    int width;
    const column_t *columns;
    int n_keys;
    int variables;
    Py_ssize_t most;
    unsigned char *bad;
    unsigned char *flags;
    uint64_t *hashes;
    int64_t *starts;
    int64_t *first_good;
    unsigned char delimiter;
    /* the line being read */
    int field;
    Py_ssize_t line_start, cell_start;
    int back;      /* the line goes back whole to Arrow and numpy */
    int doubt;     /* some cell of the line needs the engine */
    int error;     /* 1: an empty line, 2: a line of another width (or more lines than can be) */
    Py_ssize_t cr; /* position of a carriage return on the line, or -1 */
    Py_ssize_t end;         /* where the data ends */
    Py_ssize_t quote_open;  /* position of the opening quote of the current cell, or -1 */
    Py_ssize_t quote_close; /* position of its closing quote, or -1 */
    Py_ssize_t rows;
    uint64_t key_hashes[MAX_KEYS];
} scanner_t;

static void end_cell(scanner_t *s, Py_ssize_t end) {
    /* Past `most` lines (only lines refused below can get there) nothing more is written. */
    if (!s->back && s->field < s->width && s->rows < s->most) {
        const column_t *col = &s->columns[s->field];
        if (col->kind != SKIP) {
            Py_ssize_t from = s->cell_start;
            if (s->quote_open >= 0 && s->quote_close < 0) {
                s->back = 1; /* a quote never closed (only at the end of the data) */
                s->field++;
                return;
            }
            if (s->quote_open >= 0) { /* a cell quoted whole: the text between the quotes */
                from = s->quote_open + 1;
                end = s->quote_close;
            }
            cell_t cell = judge_cell(col, s->bytes + from, end - from);
            s->bad[s->rows * s->variables + col->variable] = (unsigned char)!cell.clean;
            s->doubt |= !cell.clean;
            if (cell.good && col->table != NULL && s->first_good[col->variable] < 0) {
                s->first_good[col->variable] = s->rows;
            }
            if (col->is_key) {
                s->back |= !cell.keyed; /* the engine's own reading decides this key value */
                s->key_hashes[col->key_slot] = cell.hash;
            }
        }
    }
    s->field++;
    s->quote_open = s->quote_close = -1;
}

/* The line that ends at `end` (its line feed, or the end of the data) is done. */
static void end_line(scanner_t *s, Py_ssize_t end, Py_ssize_t next) {
    if (s->rows >= s->most) {
        s->error = 2;
        return;
    }
    Py_ssize_t cell_end = end;
    if (s->cr >= 0) {
        if (s->cr == end - 1) {
            cell_end = end - 1; /* CRLF: the reader strips it too */
        } else {
            s->back = 1; /* a stray carriage return: the reader splits the line there */
        }
    }
    if (cell_end == s->line_start) {
        s->error = 1;
        return;
    }
    end_cell(s, cell_end);
    if (!s->back && s->field != s->width) {
        s->error = 2;
        return;
    }
    Py_ssize_t row = s->rows;
    s->starts[row] = s->line_start;
    s->flags[row] = (unsigned char)(s->back ? FALLBACK : s->doubt ? DOUBT : 0);
    if (s->back) {
        memset(s->bad + row * s->variables, 0, (size_t)s->variables);
        s->hashes[row] = 0;
    } else if (s->n_keys) {
        uint64_t combined = 0;
        for (int k = 0; k < s->n_keys; k++) {
            combined = combined * FOLD ^ s->key_hashes[k];
        }
        s->hashes[row] = mix(combined);
    }
    s->rows++;
    s->line_start = s->cell_start = next;
    s->field = 0;
    s->back = 0;
    s->doubt = 0;
    s->cr = -1;
    s->quote_open = s->quote_close = -1;
}

static inline void event(scanner_t *s, Py_ssize_t at) {
    unsigned char c = s->bytes[at];
    int quoted = s->quote_open >= 0 && s->quote_close < 0; /* inside a quoted cell */
    if (c == s->delimiter) {
        if (quoted) {
            return; /* part of the cell */
        }
        if (s->cr >= 0) {
            s->back = 1;
        }
        end_cell(s, at);
        s->cell_start = at + 1;
    } else if (c == '\n') {
        if (quoted) {
            s->back = 1; /* a quote left open at the line end: the reader decides */
            s->quote_open = s->quote_close = -1;
        }
        end_line(s, at, at + 1);
    } else if (c == '\r') {
        if (s->cr >= 0 || quoted) {
            s->back = 1;
        }
        s->cr = at;
    } else if (c == '"') {
        if (s->quote_open < 0 && at == s->cell_start) {
            s->quote_open = at;
        } else if (quoted) {
            /* It closes the cell only when the cell ends right after it; a doubled quote, or
             * text after the closing one, is left to the reader. */
            unsigned char next = at + 1 < s->end ? s->bytes[at + 1] : (unsigned char)s->delimiter;
            if (next == s->delimiter || next == '\n' || next == '\r') {
                s->quote_close = at;
            } else {
                s->back = 1;
                s->quote_open = s->quote_close = -1;
            }
        } else {
            s->back = 1; /* a quote inside an unquoted cell, or after a closing one */
            s->quote_open = s->quote_close = -1;
        }
    } else {
        s->back = 1; /* a byte the reader must check is UTF-8 */
    }
}

static inline int special(const scanner_t *s, unsigned char c) {
    return c == s->delimiter || c == '\n' || c == '\r' || c == '"' || c >= 0x80;
}

static void scan_range(scanner_t *s, Py_ssize_t start, Py_ssize_t end) {
    Py_ssize_t at = start;
#ifdef __SSE2__
    const __m128i delimiter = _mm_set1_epi8((char)s->delimiter), feed = _mm_set1_epi8('\n'),
                  ret = _mm_set1_epi8('\r'), quote = _mm_set1_epi8('"');
    for (; at + 16 <= end && !s->error; at += 16) {
        __m128i chunk = _mm_loadu_si128((const __m128i *)(s->bytes + at));
        __m128i hits = _mm_or_si128(_mm_or_si128(_mm_cmpeq_epi8(chunk, delimiter), _mm_cmpeq_epi8(chunk, feed)),
                                    _mm_or_si128(_mm_cmpeq_epi8(chunk, ret), _mm_cmpeq_epi8(chunk, quote)));
        unsigned mask = (unsigned)_mm_movemask_epi8(_mm_or_si128(hits, chunk)); /* high bit: not ASCII */
        while (mask && !s->error) {
            event(s, at + __builtin_ctz(mask));
            mask &= mask - 1;
        }
    }
#endif
    for (; at < end && !s->error; at++) {
        if (special(s, s->bytes[at])) {
            event(s, at);
        }
    }
    if (!s->error && s->line_start < end) {
        end_line(s, end, end); /* the file's last line, without a line feed */
    }
    if (s->rows < s->most + 1) {
        s->starts[s->rows] = s->error ? s->line_start : end;
    }
}

static int read_codes(PyObject *sequence, code_list_t *list) {
    PyObject *fast = PySequence_Fast(sequence, "codes must be a sequence of bytes");
    if (fast == NULL) {
        return -1;
    }
    Py_ssize_t size = PySequence_Fast_GET_SIZE(fast);
    if (size > MAX_CODES) {
        Py_DECREF(fast);
        PyErr_SetString(PyExc_ValueError, "too many codes");
        return -1;
    }
    for (Py_ssize_t i = 0; i < size; i++) {
        PyObject *item = PySequence_Fast_GET_ITEM(fast, i);
        char *text;
        Py_ssize_t length;
        if (PyBytes_AsStringAndSize(item, &text, &length) < 0) {
            Py_DECREF(fast);
            return -1;
        }
        list->codes[i].text = text; /* the bytes live in the caller's tuple for the whole call */
        list->codes[i].size = length;
        list->lengths |= 1ULL << (length < 63 ? length : 63);
    }
    list->count = (int)size;
    Py_DECREF(fast);
    return 0;
}

static int read_column(PyObject *spec, column_t *col) {
    PyObject *table, *codes, *prefix, *missing;
    memset(col, 0, sizeof *col);
    if (!PyArg_ParseTuple(spec, "iiiddLLOOOO", &col->kind, &col->variable, &col->nullable, &col->low, &col->high,
                          &col->low_ns, &col->high_ns, &table, &codes, &prefix, &missing)) {
        return -1;
    }
    if (read_codes(missing, &col->missing) < 0) {
        return -1;
    }
    if (table != Py_None) {
        char *bytes;
        Py_ssize_t size;
        if (PyBytes_AsStringAndSize(table, &bytes, &size) < 0) {
            return -1;
        }
        col->table = (const unsigned char *)bytes;
        col->table_width = size / 256;
    }
    col->has_codes = codes != Py_None;
    if (col->has_codes && read_codes(codes, &col->codes) < 0) {
        return -1;
    }
    if (prefix != Py_None) {
        char *bytes;
        if (PyBytes_AsStringAndSize(prefix, &bytes, &col->prefix_size) < 0) {
            return -1;
        }
        col->prefix = bytes;
    }
    return 0;
}

typedef struct {
    Py_buffer view;
    int held;
} held_buffer;

static int writable(PyObject *object, held_buffer *held, Py_ssize_t need, const char *what) {
    if (PyObject_GetBuffer(object, &held->view, PyBUF_WRITABLE | PyBUF_C_CONTIGUOUS) < 0) {
        return -1;
    }
    held->held = 1;
    if (held->view.len < need) {
        PyErr_Format(PyExc_ValueError, "%s is too small", what);
        return -1;
    }
    return 0;
}


static PyObject *judge(PyObject *self, PyObject *args) {
    (void)self;
    PyObject *data_object, *columns_spec, *keys_spec;
    PyObject *bad_object, *flags_object, *hashes_object, *starts_object, *first_object;
    Py_ssize_t start, end;
    int delimiter, width;
    if (!PyArg_ParseTuple(args, "OnniiOOOOOOO", &data_object, &start, &end, &delimiter, &width, &columns_spec,
                          &keys_spec, &bad_object, &flags_object, &hashes_object, &starts_object,
                          &first_object)) {
        return NULL;
    }
    if (width < 1 || width > MAX_COLUMNS || PySequence_Size(columns_spec) != width) {
        PyErr_SetString(PyExc_ValueError, "one column spec per file column, at most 256");
        return NULL;
    }
    column_t *columns = PyMem_Calloc((size_t)width, sizeof(column_t));
    if (columns == NULL) {
        return PyErr_NoMemory();
    }
    PyObject *result = NULL;
    int n_keys = 0, variables = 0;
    for (int i = 0; i < width; i++) {
        PyObject *spec = PySequence_GetItem(columns_spec, i);
        int failed = spec == NULL || read_column(spec, &columns[i]) < 0;
        Py_XDECREF(spec); /* the tuple of specs holds every object the column points into */
        if (failed) {
            goto free_columns;
        }
        if (columns[i].kind != SKIP && columns[i].variable + 1 > variables) {
            variables = columns[i].variable + 1;
        }
    }
    Py_ssize_t key_count = PySequence_Size(keys_spec);
    if (key_count < 0 || key_count > MAX_KEYS) {
        PyErr_SetString(PyExc_ValueError, "at most 16 key columns");
        goto free_columns;
    }
    for (Py_ssize_t i = 0; i < key_count; i++) {
        PyObject *item = PySequence_GetItem(keys_spec, i);
        long index = item == NULL ? -1 : PyLong_AsLong(item);
        Py_XDECREF(item);
        if (index < 0 || index >= width || columns[index].kind == SKIP || columns[index].is_key) {
            if (!PyErr_Occurred()) {
                PyErr_SetString(PyExc_ValueError, "a key column that is not judged, or named twice");
            }
            goto free_columns;
        }
        columns[index].key_slot = n_keys++;
        columns[index].is_key = 1;
    }

    Py_buffer data;
    if (PyObject_GetBuffer(data_object, &data, PyBUF_C_CONTIGUOUS) < 0) {
        goto free_columns;
    }
    held_buffer bad = {0}, flags = {0}, hashes = {0}, starts = {0}, first = {0};
    if (start < 0 || end > data.len || start > end) {
        PyErr_SetString(PyExc_ValueError, "start and end must lie within the data");
        goto done;
    }
    /* Every line holds at least width - 1 delimiters and a line end. */
    Py_ssize_t most = (end - start) / width + 1;
    if (writable(bad_object, &bad, most * (variables ? variables : 1), "bad") < 0 ||
        writable(flags_object, &flags, most, "flags") < 0 ||
        writable(hashes_object, &hashes, most * 8, "hashes") < 0 ||
        writable(starts_object, &starts, (most + 1) * 8, "starts") < 0 ||
        writable(first_object, &first, (Py_ssize_t)(variables ? variables : 1) * 8, "first_good") < 0) {
        goto done;
    }
    const unsigned char *bytes = (const unsigned char *)data.buf;
    unsigned char *bad_out = bad.view.buf, *flags_out = flags.view.buf;
    uint64_t *hash_out = hashes.view.buf;
    int64_t *start_out = starts.view.buf, *first_out = first.view.buf;
    for (int v = 0; v < variables; v++) {
        first_out[v] = -1;
    }
    scanner_t scanner = {
        .bytes = bytes, .width = width, .columns = columns, .n_keys = n_keys,
        .variables = variables, .most = most, .bad = bad_out, .flags = flags_out, .hashes = hash_out,
        .starts = start_out, .first_good = first_out, .delimiter = (unsigned char)delimiter,
        .line_start = start, .cell_start = start, .cr = -1, .end = end, .quote_open = -1, .quote_close = -1,
    };
    Py_BEGIN_ALLOW_THREADS;
    scan_range(&scanner, start, end);
    Py_END_ALLOW_THREADS;
    if (scanner.error) {
        PyErr_Format(PyExc_ValueError,
                     scanner.error == 1 ? "an empty line at line %zd of the piece"
                                        : "a line of another width at line %zd of the piece",
                     scanner.rows);
        goto done;
    }
    result = PyLong_FromSsize_t(scanner.rows);
done:
    PyBuffer_Release(&data);
    held_buffer *all[] = {&bad, &flags, &hashes, &starts, &first};
    for (size_t i = 0; i < sizeof all / sizeof all[0]; i++) {
        if (all[i]->held) {
            PyBuffer_Release(&all[i]->view);
        }
    }
free_columns:
    PyMem_Free(columns);
    return result;
}

/* sorted_high_halves(hashes, out): the upper 32 bits of each uint64 hash, sorted into the uint32
 * buffer out. An LSD radix sort, four passes of one byte: several times faster than a comparison
 * sort on the hundreds of thousands of hashes of one piece. */
static PyObject *sorted_high_halves(PyObject *self, PyObject *args) {
    (void)self;
    PyObject *hashes_object, *out_object;
    if (!PyArg_ParseTuple(args, "OO", &hashes_object, &out_object)) {
        return NULL;
    }
    Py_buffer hashes;
    if (PyObject_GetBuffer(hashes_object, &hashes, PyBUF_C_CONTIGUOUS) < 0) {
        return NULL;
    }
    held_buffer out = {0};
    PyObject *result = NULL;
    Py_ssize_t count = hashes.len / 8;
    uint32_t *spare = NULL;
    if (writable(out_object, &out, count * 4, "out") < 0) {
        goto done;
    }
    spare = PyMem_Malloc((size_t)(count ? count : 1) * sizeof(uint32_t));
    if (spare == NULL) {
        PyErr_NoMemory();
        goto done;
    }
    Py_BEGIN_ALLOW_THREADS;
    const uint64_t *from = hashes.buf;
    uint32_t *keys = out.view.buf, *other = spare;
    size_t counts[4][256];
    memset(counts, 0, sizeof counts);
    for (Py_ssize_t i = 0; i < count; i++) {
        uint32_t high = (uint32_t)(from[i] >> 32);
        keys[i] = high;
        for (int pass = 0; pass < 4; pass++) {
            counts[pass][(high >> (8 * pass)) & 0xFF]++;
        }
    }
    for (int pass = 0; pass < 4; pass++) {
        size_t total = 0;
        for (int b = 0; b < 256; b++) {
            size_t here = counts[pass][b];
            counts[pass][b] = total;
            total += here;
        }
        for (Py_ssize_t i = 0; i < count; i++) {
            uint32_t key = keys[i];
            other[counts[pass][(key >> (8 * pass)) & 0xFF]++] = key;
        }
        uint32_t *swap = keys;
        keys = other;
        other = swap;
    }
    /* after an even number of passes the sorted keys are back in out */
    Py_END_ALLOW_THREADS;
    result = Py_NewRef(Py_None);
done:
    PyMem_Free(spare);
    PyBuffer_Release(&hashes);
    if (out.held) {
        PyBuffer_Release(&out.view);
    }
    return result;
}

/* gather_lines(data, low, high, out): the lines kept from a block, copied into one buffer for
 * Arrow to parse (a numpy gather needs an index per byte: 20 ms for 50,000 lines). */
static PyObject *gather_lines(PyObject *self, PyObject *args) {
    (void)self;
    PyObject *data_object, *low_object, *high_object, *out_object;
    if (!PyArg_ParseTuple(args, "OOOO", &data_object, &low_object, &high_object, &out_object)) {
        return NULL;
    }
    Py_buffer data, low = {0}, high = {0};
    held_buffer out = {0};
    PyObject *result = NULL;
    if (PyObject_GetBuffer(data_object, &data, PyBUF_SIMPLE) < 0) {
        return NULL;
    }
    if (PyObject_GetBuffer(low_object, &low, PyBUF_C_CONTIGUOUS) < 0) {
        goto done;
    }
    if (PyObject_GetBuffer(high_object, &high, PyBUF_C_CONTIGUOUS) < 0) {
        goto done;
    }
    if (low.len != high.len || low.len % 8 != 0) {
        PyErr_SetString(PyExc_ValueError, "low and high must be int64 arrays of the same length");
        goto done;
    }
    Py_ssize_t count = low.len / 8, total = 0;
    const int64_t *lows = low.buf, *highs = high.buf;
    for (Py_ssize_t i = 0; i < count; i++) {
        if (lows[i] < 0 || lows[i] > highs[i] || highs[i] > data.len) {
            PyErr_SetString(PyExc_ValueError, "a line range lies outside the data");
            goto done;
        }
        total += (Py_ssize_t)(highs[i] - lows[i]);
    }
    if (writable(out_object, &out, total, "out") < 0) {
        goto done;
    }
    Py_BEGIN_ALLOW_THREADS;
    char *to = out.view.buf;
    const char *from = data.buf;
    for (Py_ssize_t i = 0; i < count; i++) {
        size_t size = (size_t)(highs[i] - lows[i]);
        memcpy(to, from + lows[i], size);
        to += size;
    }
    Py_END_ALLOW_THREADS;
    result = PyLong_FromSsize_t(total);
done:
    PyBuffer_Release(&data);
    if (low.obj != NULL) {
        PyBuffer_Release(&low);
    }
    if (high.obj != NULL) {
        PyBuffer_Release(&high);
    }
    if (out.held) {
        PyBuffer_Release(&out.view);
    }
    return result;
}

static PyMethodDef methods[] = {
    {"judge", judge, METH_VARARGS, "Judge the lines of a piece of a plain delimited file (see the module source)."},
    {"sorted_high_halves", sorted_high_halves, METH_VARARGS, "The upper halves of uint64 hashes, sorted."},
    {"gather_lines", gather_lines, METH_VARARGS, "Byte ranges of a buffer copied one after another into out."},
    {NULL, NULL, 0, NULL},
};

static struct PyModuleDef module = {PyModuleDef_HEAD_INIT, "_rowscan", "Judge plain delimited lines from their bytes.",
                                    -1, methods, NULL, NULL, NULL, NULL};

PyMODINIT_FUNC PyInit__rowscan(void) { return PyModule_Create(&module); }
