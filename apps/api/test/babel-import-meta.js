// Babel plugin for Jest only: @nestjs 12 packages are ES modules that read import.meta.url,
// which CommonJS has no equivalent of; rewrite it to the file's own URL.
module.exports = function importMetaToFilename() {
  return {
    visitor: {
      MetaProperty(path) {
        const parent = path.parentPath;
        if (parent && parent.isMemberExpression() && parent.node.property.name === 'url') {
          parent.replaceWithSourceString('"file://" + __filename');
        }
      },
    },
  };
};
