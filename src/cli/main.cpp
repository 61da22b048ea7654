// Placeholder while the command line is written; replaced in the same change.
int main() { return 0; }
