// The `stage` command (being written).
int main() { return 0; }
